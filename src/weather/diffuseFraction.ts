/**
 * Hourly diffuse fraction DHI/GHI from the clearness index kt, Erbs, Klein & Duffie, Solar Energy 28,
 * 293 (1982): 1 − 0.09 kt (kt ≤ 0.22); 0.9511 − 0.1604 kt + 4.388 kt² − 16.638 kt³ + 12.336 kt⁴
 * (0.22 < kt ≤ 0.80); 0.165 (kt > 0.80).
 */
export function erbsDiffuseFraction(kt: number): number {
  if (kt <= 0.22) return 1 - 0.09 * kt;
  if (kt <= 0.8) return 0.9511 + kt * (-0.1604 + kt * (4.388 + kt * (-16.638 + kt * 12.336)));
  return 0.165;
}
