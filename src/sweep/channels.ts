import type { MaterialRegistry } from "../materials/registry.js";
import type { Study } from "../study/studyTypes.js";
import type { TracerModule } from "../workers/tracerModule.js";

/** Channel names of a combination's stack (compiled at the first grid wavelength). */
export function comboChannels(study: Study, registry: MaterialRegistry, tracer: TracerModule): string[] {
  return tracer.channelNames(tracer.compileStack(study, registry, study.grid.wavelengthNm[0]) as never);
}
