/** Public surface of the physics core (pure: no fs, no clock, no UI). */
export * from './model.js';
export * from './pipe-experiment-model.js';
export * from './gas.js';
export { simulatePoint, type SimulateOptions, type WarmStart, SimulationError } from './engine.js';
export { DEFAULT_SCHEME } from './pipe/factory.js';
export { runPipeExperiment } from './pipe-experiment.js';
export { characteristicsRangeIssue, CHECKED_SPLIT } from './pipe/moc.js';
export { cylinderVolume, sweptVolume, clearanceVolume } from './kinematics.js';
export { valveLift, curtainArea, effectiveArea, dischargeCoefficient, DEFAULT_CD_TABLE } from './valve.js';
export { buildMesh, sectionsVolume, totalLength } from './pipe/mesh.js';
export { orificeMassFlow } from './flow.js';
