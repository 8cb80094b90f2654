/** The stored original differs from the file confirmed at upload: the run stops before any analysis. */
export class OriginalChangedError extends Error {
  constructor() {
    super("The stored original no longer matches the file confirmed at upload (its SHA-256 differs), so it was not analysed. Tell an admin; upload the record again as a new capture.");
    this.name = "OriginalChangedError";
  }
}

/** Refuses a file whose hash is not the one recorded at confirmation (captures confirmed before hashes were kept have none). */
export function checkOriginal(expected: string | null, actual: string): void {
  if (expected && expected !== actual) throw new OriginalChangedError();
}
