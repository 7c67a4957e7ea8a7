/** Shared numeric constants and angle helpers. */
export const DEG = Math.PI / 180;
export const RAD = 180 / Math.PI;
export const degToRad = (angleDeg: number): number => angleDeg * DEG;
export const radToDeg = (angleRad: number): number => angleRad * RAD;
/** Elementary charge in C (CODATA 2018, exact). */
export const Q_ELEMENTARY_C = 1.602176634e-19;
/** Planck constant in J·s (CODATA 2018, exact). */
export const H_PLANCK_JS = 6.62607015e-34;
/** Speed of light in vacuum in m/s (exact). */
export const C_LIGHT_MS = 299792458;
