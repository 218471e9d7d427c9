/**
 * An error of the pure core with a short machine-readable `code` next to its message (which says
 * what was wrong and what to do). Each module's error extends it and names itself, so callers
 * tell them apart with instanceof and by `name`.
 */
export abstract class CodedError<Code extends string = string> extends Error {
  abstract override readonly name: string;

  constructor(
    readonly code: Code,
    message: string,
  ) {
    super(message);
  }
}
