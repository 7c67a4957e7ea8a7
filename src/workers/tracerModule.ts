import { pathToFileURL } from "node:url";
import type { MaterialRegistry } from "../materials/registry.js";
import type { RandomStream } from "../random/stream.js";
import type { Study } from "../study/studyTypes.js";
import type { CompileOptions } from "../trace/compile.js";
import type { LaunchPoints } from "../trace/launchPoints.js";
import * as ownTracer from "../trace/index.js";

/** The tracer functions the runner uses (docs/contracts.md, Tracer). */
export interface TracerModule {
  compileStack(study: Study, registry: MaterialRegistry, wavelengthNm: number, options?: CompileOptions): unknown;
  channelNames(compiled: never): string[];
  traceBatch(cs: never, thetaDeg: number, phiDeg: number | null, nRays: number, rng: RandomStream, tally: Float64Array, polarization?: "unpolarized", side?: "front" | "rear", launch?: LaunchPoints | null): void;
}

/**
 * The tracer: lightfold's own (src/trace) unless a module file is named, which tests use to run the
 * pool with small stand-ins (one that throws, one whose channels do not add up).
 */
export async function loadTracer(modulePath?: string): Promise<TracerModule> {
  // lightfold's own tracer is imported statically, with the rest of the worker's module graph.
  if (modulePath === undefined) return ownTracer as unknown as TracerModule;
  return (await import(pathToFileURL(modulePath).href)) as TracerModule;
}
