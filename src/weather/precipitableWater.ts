/**
 * Saturation water-vapour pressure over water, hPa (mbar), T in kelvin: Gueymard, J. Appl. Meteor. 32,
 * 1294 (1993), Eq. 1: e_s = exp(22.330 − 49.140 (100/T) − 10.922 (100/T)² − 0.39015 T/100).
 */
export function saturationVapourPressureHpa(tempK: number): number {
  const x = 100 / tempK;
  return Math.exp(22.33 - 49.14 * x - 10.922 * x * x - 0.39015 * (tempK / 100));
}

/**
 * Precipitable water (cm) from surface air temperature and relative humidity, Gueymard, Solar Energy
 * 53, 57 (1994): w = 0.1 H_v ρ_v (Eq. 1), ρ_v = 216.7 RH e_s / T in g/m³ (Eq. 2, RH as a fraction,
 * e_s in hPa), apparent water-vapour scale height H_v = 0.4976 + 1.5265 θ + exp(13.6897 θ − 14.9188 θ³)
 * km with θ = T/273.15 (Eq. 4). Stated accuracy about 20 % for 1–3 cm. Floored at 0.01 cm.
 */
export function precipitableWaterCm(airTempC: number, relHumidityPct: number): number {
  const t = airTempC + 273.15;
  const theta = t / 273.15;
  const rhoV = (216.7 * (relHumidityPct / 100) * saturationVapourPressureHpa(t)) / t;
  const hV = 0.4976 + 1.5265 * theta + Math.exp(13.6897 * theta - 14.9188 * theta ** 3);
  return Math.max(0.01, 0.1 * hV * rhoV);
}
