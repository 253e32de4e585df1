/** An exploration the core refuses as asked (grid too big, an input the study does not have); `field` names what to change. */
export class ExploreError extends Error {
  constructor(
    message: string,
    readonly field: string,
  ) {
    super(message);
    this.name = 'ExploreError';
  }
}
