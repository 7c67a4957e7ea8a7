import { INPUT_ERROR_TAG } from "./traceTask.js";

/**
 * Runs fn; an error is re-thrown with the task's place (`where()`, e.g. "combo 0, …, batch 3") in
 * front, and input errors are tagged so they stay input errors across the thread (drainPool).
 */
export function withTaskWhere<T>(where: () => string, fn: () => T): T {
  try {
    return fn();
  } catch (err) {
    const e = err as Error;
    const tag = e.name === "InputError" ? INPUT_ERROR_TAG : "";
    const wrapped = new Error(`${tag}task failed at ${where()}: ${e.message}`);
    if (e.stack) wrapped.stack = `${wrapped.message}\n${e.stack.split("\n").slice(1).join("\n")}`;
    throw wrapped;
  }
}
