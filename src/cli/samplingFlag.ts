import type { LaunchSampling } from "../random/sobol.js";
import { InputError } from "../util/errors.js";

/** The --sampling flag: launch sampling "random" or "sobol" (undefined when not given). */
export function samplingFlag(text: string | undefined): LaunchSampling | undefined {
  if (text === undefined || text === "random" || text === "sobol") return text;
  throw new InputError(
    `--sampling: expected "random" or "sobol", got "${text}"`,
    "random (independent rays) or sobol (scrambled Sobol' launch points, errors from independent replicas), e.g. --sampling sobol",
  );
}
