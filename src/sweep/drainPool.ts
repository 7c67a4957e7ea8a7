import { InputError } from "../util/errors.js";
import { INPUT_ERROR_TAG, type TraceMessage } from "../workers/traceTask.js";

/** Where the drain gets its messages (a sweep's by default) and puts their results. */
export interface MessageSource<R, M = TraceMessage> {
  queued(): number;
  take(): { msg: M; runs: R };
  /** Folds a message's result in (may queue more); a throw stops the drain. */
  accept(runs: R, out: Float64Array): void;
}

/** What the drain needs of a pool: a way to run a message (TracePool, a TraceRunner). */
export interface MessageRunner<M> {
  run(msg: M): Promise<Float64Array>;
}

/**
 * Keeps up to maxInFlight messages on the pool until the source is empty. On the first failure no
 * more messages are sent; the promise rejects with it once the messages in flight have settled
 * (their results are dropped), so the pool is never closed under a running task.
 */
export function drainPool<R, M = TraceMessage>(pool: MessageRunner<M>, maxInFlight: number, source: MessageSource<R, M>): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    let inFlight = 0;
    let failure: Error | undefined;
    const settle = (): void => {
      if (inFlight > 0) return;
      if (failure !== undefined) reject(failure);
      else if (source.queued() === 0) resolve();
    };
    const done = (runs: R, out: Float64Array): void => {
      inFlight--;
      if (failure === undefined) {
        try {
          source.accept(runs, out);
        } catch (err) {
          failure = err instanceof Error ? err : new Error(String(err));
        }
      }
      if (failure === undefined) pump();
      settle();
    };
    const pump = (): void => {
      while (failure === undefined && inFlight < maxInFlight && source.queued() > 0) {
        const { msg, runs } = source.take();
        inFlight++;
        pool.run(msg).then((out) => done(runs, out), (err: unknown) => {
          inFlight--;
          failure ??= describeFailure(err);
          settle();
        });
      }
      settle();
    };
    pump();
  });
}

/** A worker's error as it crossed the thread: input problems (tagged by the worker) stay InputErrors. */
function describeFailure(err: unknown): Error {
  const e = err instanceof Error ? err : new Error(String(err));
  if (e.message.startsWith(INPUT_ERROR_TAG)) return new InputError(e.message.slice(INPUT_ERROR_TAG.length));
  return e;
}
