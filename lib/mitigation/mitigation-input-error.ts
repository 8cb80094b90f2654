/** A what-if cannot be computed from the inputs given (a missing or wrong value, named in the message). */
export class MitigationInputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "MitigationInputError";
  }
}
