/** The health report could not be read; `message` says why in words for the planner. */
export class HealthCheckFailed extends Error {
  /** Creates the error with a message fit to show on screen. */
  constructor(message: string) {
    super(message);
    this.name = 'HealthCheckFailed';
  }
}
