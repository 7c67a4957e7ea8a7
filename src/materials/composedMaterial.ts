import { InputError } from "../util/errors.js";
import type { Curve } from "./curve.js";
import type { CatalogMaterial, NK } from "./types.js";

export interface MaterialInfo {
  name: string;
  description: string;
  source: string;
  shortSource: string;
  kind: CatalogMaterial["kind"];
}

/** Formats a wavelength range for messages and listings, e.g. "250–1450 nm". */
export function formatRangeNm(minNm: number, maxNm: number): string {
  return `${formatNm(minNm)}–${formatNm(maxNm)} nm`;
}

function formatNm(v: number): string {
  return Number.isInteger(v) ? String(v) : String(Number(v.toPrecision(6)));
}

/**
 * A material whose n and k come from two curves, resolved on first use (tables are read only when
 * a material is used). Its range is the overlap of both curves' ranges; outside it nk() throws.
 */
export class ComposedMaterial implements CatalogMaterial {
  readonly name: string;
  readonly description: string;
  readonly source: string;
  readonly shortSource: string;
  readonly kind: CatalogMaterial["kind"];
  private readonly resolve: () => { n: Curve; k: Curve };
  private curves: { n: Curve; k: Curve } | null = null;

  constructor(info: MaterialInfo, resolve: () => { n: Curve; k: Curve }) {
    this.name = info.name;
    this.description = info.description;
    this.source = info.source;
    this.shortSource = info.shortSource;
    this.kind = info.kind;
    this.resolve = resolve;
  }

  private get c(): { n: Curve; k: Curve } {
    if (this.curves === null) this.curves = this.resolve();
    return this.curves;
  }

  get minWavelengthNm(): number {
    return Math.max(this.c.n.minNm, this.c.k.minNm);
  }

  get maxWavelengthNm(): number {
    return Math.min(this.c.n.maxNm, this.c.k.maxNm);
  }

  nk(wavelengthNm: number): NK {
    const c = this.c;
    const lo = Math.max(c.n.minNm, c.k.minNm);
    const hi = Math.min(c.n.maxNm, c.k.maxNm);
    if (!(wavelengthNm >= lo && wavelengthNm <= hi)) {
      throw new InputError(
        `material "${this.name}" has data for ${formatRangeNm(lo, hi)}; wavelength ${wavelengthNm} nm is outside it (no extrapolation)`,
        "choose a wavelength grid inside the material's range or another material (lightfold materials lists the ranges)",
      );
    }
    return { n: c.n.at(wavelengthNm), k: c.k.at(wavelengthNm) };
  }
}
