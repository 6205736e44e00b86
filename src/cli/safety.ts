/** The short safety caution shown with help screens (DESIGN §5). */
export const SAFETY_CAUTION = [
  'Caution: results are estimates from a simplified model; verify them on an',
  'engine. Changing an intake changes the fuelling the engine needs: more air on',
  'the same fuel runs lean, which can cause detonation and engine damage. Dyno and',
  'road testing carry their own hazards, and intake changes can breach emissions',
  'rules. Follow local regulations and qualified practice.',
].join('\n');
