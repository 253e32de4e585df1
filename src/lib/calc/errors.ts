/** A study the core cannot solve as given; `path` names the field to look at. */
export class CalculationError extends Error {
  constructor(
    message: string,
    readonly path: (string | number)[] = [],
  ) {
    super(message);
    this.name = 'CalculationError';
  }
}
