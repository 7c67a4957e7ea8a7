/**
 * View factors between surfaces that are infinitely long in one direction (2D), by Hottel's
 * crossed-strings rule (Incropera & DeWitt, Fundamentals of Heat and Mass Transfer, ch. 13; Modest,
 * Radiative Heat Transfer, ch. 4): for segments 1 = (a, b) and 2 = (c, d) that see each other
 * without obstruction, F(1→2) = [(|ad| + |bc|) − (|ac| + |bd|)] / (2 |ab|), where the crossed
 * strings are the diagonals of the quadrilateral a–b–d–c.
 */
export function crossedStringsViewFactor(
  ax: number, az: number, bx: number, bz: number,
  cx: number, cz: number, dx: number, dz: number,
): number {
  const len = (x0: number, z0: number, x1: number, z1: number): number => Math.hypot(x1 - x0, z1 - z0);
  const ad = len(ax, az, dx, dz), bc = len(bx, bz, cx, cz);
  const ac = len(ax, az, cx, cz), bd = len(bx, bz, dx, dz);
  return Math.abs(ad + bc - ac - bd) / (2 * len(ax, az, bx, bz));
}

/**
 * Isolated tilted plane over an infinite horizontal ground, tilt β: the front sees the sky with
 * (1 + cos β)/2 and the ground with (1 − cos β)/2; the rear (facing 180° − β) sees the sky with
 * (1 − cos β)/2 and the ground with (1 + cos β)/2 (Duffie & Beckman, ch. 2; Liu & Jordan).
 */
export function isolatedPlaneViewFactors(tiltDeg: number): { frontSky: number; frontGround: number; rearSky: number; rearGround: number } {
  const c = Math.cos((tiltDeg * Math.PI) / 180);
  return { frontSky: 0.5 * (1 + c), frontGround: 0.5 * (1 - c), rearSky: 0.5 * (1 - c), rearGround: 0.5 * (1 + c) };
}
