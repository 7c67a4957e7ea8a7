import { MaterialRegistry } from "../materials/registry.js";
import { registerStudyMaterials } from "../materials/spec.js";

/** The builtin catalogue plus a study's own material entries (file paths relative to baseDir). */
export function buildMaterialRegistry(materialSpecs: unknown[], baseDir: string): MaterialRegistry {
  const registry = MaterialRegistry.withBuiltins();
  registerStudyMaterials(registry, materialSpecs, baseDir, "materials");
  return registry;
}
