/** Demo step 4: synthetic year, yield at two tilts, tilt sweep, texture benefit (filled in by the yield module). */
import type { ResponseMatrix } from "../src/response/responseMatrix.js";

export interface DemoYieldInput {
  sitePath: string;
  tiltsDeg: number[];
  stacks: { label: string; dir: string; matrix: ResponseMatrix }[];
}

export interface DemoYieldSummary {
  siteName: string;
  year: number;
  annualAhM2(stack: string, tiltDeg: number): number | undefined;
  benefitText: string;
}

export function runDemoYield(_input: DemoYieldInput): DemoYieldSummary | null {
  return null;
}
