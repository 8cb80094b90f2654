/** Thrown for a limit-set key that names no limit set (in the seed files or the database); the message says which keys exist. */
export class UnknownLimitSetError extends Error {}
