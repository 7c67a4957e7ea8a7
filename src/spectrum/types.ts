/** A solar (or lamp) spectrum: spectral irradiance on a strictly increasing wavelength grid. */
export interface Spectrum {
  name: string;
  wavelengthNm: Float64Array;
  irradianceWm2PerNm: Float64Array;
}
