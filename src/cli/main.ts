import { Command, CommanderError } from "commander";
import { InputError, EXIT_BAD_INPUT, EXIT_FAILURE } from "../util/errors.js";
import { toolVersion } from "../util/version.js";
import { commandModules } from "./commands/index.js";

/** Builds the commander program; every verb lives in its own file under commands/. */
export function buildProgram(): Command {
  const program = new Command("lightfold")
    .description("Monte Carlo ray optics for textured crystalline-silicon solar cells and modules")
    .version(toolVersion())
    .showHelpAfterError("(run with --help for usage and examples)")
    .exitOverride();
  for (const mod of commandModules) mod.register(program);
  return program;
}

/** The only place that exits the process. */
export async function main(argv: string[]): Promise<number> {
  const program = buildProgram();
  try {
    await program.parseAsync(argv);
    return process.exitCode === undefined ? 0 : Number(process.exitCode);
  } catch (err) {
    if (err instanceof CommanderError) {
      if (err.code === "commander.helpDisplayed" || err.code === "commander.version" || err.exitCode === 0) return 0;
      return EXIT_BAD_INPUT;
    }
    if (err instanceof InputError) {
      process.stderr.write(`lightfold: ${err.message}\n`);
      if (err.hint) process.stderr.write(`hint: ${err.hint}\n`);
      return EXIT_BAD_INPUT;
    }
    const message = err instanceof Error ? (err.stack ?? err.message) : String(err);
    process.stderr.write(`lightfold: failed: ${message}\n`);
    return EXIT_FAILURE;
  }
}
