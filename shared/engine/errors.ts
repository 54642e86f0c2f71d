/** The one error type the engine throws for input it cannot work with. */
export class InputError extends Error {
  /** JSON path of the offending field, e.g. "/supply/negativeV". */
  readonly path: string;

  constructor(path: string, message: string) {
    super(`${path}: ${message}`);
    this.name = 'InputError';
    this.path = path;
  }
}
