import { InputError } from "../util/errors.js";
import { BUILTIN_ALIASES, builtinMaterials } from "./builtins.js";
import { suggestNames } from "../util/didYouMean.js";
import type { Material } from "./types.js";

/**
 * Named materials: the built-in catalogue, its aliases (e.g. "Si" → "Si-Green2008") and user
 * materials. A user material may take a built-in's name (or alias) only with { override: true }.
 */
export class MaterialRegistry {
  private readonly builtins = new Map<string, Material>();
  private readonly aliases = new Map<string, string>();
  private readonly user = new Map<string, Material>();

  /** A registry holding every built-in material (tables are read when a material is first used). */
  static withBuiltins(): MaterialRegistry {
    const r = new MaterialRegistry();
    for (const m of builtinMaterials()) r.builtins.set(m.name, m);
    for (const [alias, target] of Object.entries(BUILTIN_ALIASES)) r.aliases.set(alias, target);
    return r;
  }

  /** The material of this name or alias; unknown names throw InputError with did-you-mean suggestions. */
  get(name: string): Material {
    const m = this.find(name);
    if (m !== undefined) return m;
    const suggestions = suggestNames(name, this.names());
    throw new InputError(
      `unknown material "${name}"` + (suggestions.length > 0 ? `; did you mean ${suggestions.map((s) => `"${s}"`).join(", ")}?` : ""),
      "run `lightfold materials` for the built-in list, or define it under \"materials\" in the study file",
    );
  }

  /** The material of this name or alias, or undefined. */
  find(name: string): Material | undefined {
    const u = this.user.get(name);
    if (u !== undefined) return u;
    const b = this.builtins.get(name);
    if (b !== undefined) return b;
    const target = this.aliases.get(name);
    return target === undefined ? undefined : this.builtins.get(target);
  }

  has(name: string): boolean {
    return this.find(name) !== undefined;
  }

  /** True when `name` is a built-in material name or alias. */
  isBuiltinName(name: string): boolean {
    return this.builtins.has(name) || this.aliases.has(name);
  }

  /**
   * Adds a user material. A name used by a built-in material or alias is refused unless
   * opts.override is true; a second user material with the same name is always refused.
   */
  add(m: Material, opts: { override?: boolean } = {}): void {
    if (this.user.has(m.name)) throw new InputError(`material "${m.name}" is defined twice`);
    if (this.isBuiltinName(m.name) && opts.override !== true) {
      throw new InputError(
        `material "${m.name}" has the name of a built-in material; set "override": true to replace it, or choose another name`,
      );
    }
    this.user.set(m.name, m);
  }

  /** Built-in materials not overridden, in catalogue order, then user materials in order added. */
  list(): Material[] {
    const out: Material[] = [];
    for (const [name, m] of this.builtins) if (!this.user.has(name)) out.push(m);
    for (const m of this.user.values()) out.push(m);
    return out;
  }

  /** Alias → material name (e.g. { Si: "Si-Green2008" }). */
  aliasTable(): Record<string, string> {
    return Object.fromEntries(this.aliases);
  }

  /** All names and aliases known (for suggestions). */
  names(): string[] {
    return [...new Set([...this.user.keys(), ...this.builtins.keys(), ...this.aliases.keys()])];
  }
}
