/** Complex refractive index N = n + ik (k ≥ 0: absorption). */
export interface NK {
  n: number;
  k: number;
}

/** An optical material: n and k as functions of vacuum wavelength over a stated range. */
export interface Material {
  /** Catalogue key, e.g. "Si-Green2008". */
  readonly name: string;
  readonly description: string;
  /** Citation of the data or formula. */
  readonly source: string;
  readonly minWavelengthNm: number;
  readonly maxWavelengthNm: number;
  /** n and k at a vacuum wavelength; throws InputError outside [min, max] naming material, range and λ. */
  nk(wavelengthNm: number): NK;
}

/** A built-in or user material with a short citation for listings. */
export interface CatalogMaterial extends Material {
  /** Short form of the source for tables, e.g. "Green 2008". */
  readonly shortSource: string;
  /** How n and k are obtained: a measured table, a dispersion formula, or a constant. */
  readonly kind: "table" | "formula" | "constant";
}
