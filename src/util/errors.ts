/**
 * Bad input from the user (study file, CSV, flags): the CLI prints the message (+ hint) on one line
 * and exits with code 2. Messages name the file, field path or line and what was expected.
 */
export class InputError extends Error {
  readonly hint: string | undefined;
  constructor(message: string, hint?: string) {
    super(message);
    this.name = "InputError";
    this.hint = hint;
  }
}

/** Exit codes of every lightfold command (documented in the README). */
export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_BAD_INPUT = 2;
