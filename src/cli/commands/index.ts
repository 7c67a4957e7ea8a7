import type { Command } from "commander";
import * as exportCmd from "./export.js";
import * as spectralCmd from "./spectral.js";
import * as materialsCmd from "./materials.js";
import * as clusterCmd from "./cluster.js";
import * as reportCmd from "./report.js";

/** A CLI verb: adds itself (options, help with examples, action) to the program. */
export interface CommandModule {
  register(program: Command): void;
}

// Each verb's module is listed here once; order = order in `lightfold --help`.
export const commandModules: CommandModule[] = [materialsCmd, exportCmd, spectralCmd, clusterCmd, reportCmd];
