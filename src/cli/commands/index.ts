import type { Command } from "commander";
import * as checkCmd from "./check.js";
import * as sweepCmd from "./sweep.js";
import * as traceCmd from "./trace.js";
import * as generationCmd from "./generation.js";
import * as mergeCmd from "./merge.js";
import * as exportCmd from "./export.js";
import * as spectralCmd from "./spectral.js";
import * as convergeCmd from "./converge.js";
import * as materialsCmd from "./materials.js";
import * as filmCmd from "./film.js";
import * as clusterCmd from "./cluster.js";
import * as reportCmd from "./report.js";
import * as weatherCmd from "./weather.js";
import * as yieldCmd from "./yield.js";
import * as compareCmd from "./compare.js";
import * as optimizeCmd from "./optimize.js";

/** A CLI verb: adds itself (options, help with examples, action) to the program. */
export interface CommandModule {
  register(program: Command): void;
}

// Each verb's module is listed here once; order = order in `lightfold --help`.
export const commandModules: CommandModule[] = [checkCmd, traceCmd, generationCmd, sweepCmd, mergeCmd, materialsCmd, filmCmd, exportCmd, spectralCmd, convergeCmd, clusterCmd, reportCmd, weatherCmd, yieldCmd, compareCmd, optimizeCmd];
