import { expect } from "vitest";
import { InputError } from "../../src/util/errors.js";

/** The InputError message thrown by fn (fails the test when nothing or something else is thrown). */
export function inputErrorOf(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as Error).message;
  }
  throw new Error("expected an InputError");
}
