/** The one error the core throws: a run that cannot start or that diverged. */
export class SimulationError extends Error {
  constructor(
    readonly code: 'diverged' | 'invalid',
    message: string,
  ) {
    super(message);
    this.name = 'SimulationError';
  }
}
