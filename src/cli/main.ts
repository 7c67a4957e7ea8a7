import { Command, CommanderError } from "commander";
import { InputError, EXIT_BAD_INPUT, EXIT_FAILURE } from "../util/errors.js";
import { toolVersion } from "../util/version.js";
import { commandModules } from "./commands/index.js";

const EXIT_CODES = "Exit codes: 0 ok, 1 failure (a run that could not finish), 2 bad input (file, field or flag named).";

const GLOBAL_HELP = `
Typical session:
  lightfold check configs/demo-random-pyramids.study.json     validate a study without running it
  lightfold sweep configs/demo-random-pyramids.study.json     response matrix on all cores (resumable)
  lightfold yield --matrix runs/demo-random-pyramids/base/matrix.json \\
      --site configs/sites/brevenmark.site.json --weather synthetic --tilt 0:90:5
  lightfold report runs/demo-random-pyramids                  HTML page with every plot

${EXIT_CODES}
Output is plain text without colour (NO_COLOR is respected by construction); --json on summary commands.`;

/** Builds the commander program; every verb lives in its own file under commands/. */
export function buildProgram(): Command {
  const program = new Command("lightfold")
    .description("Monte Carlo ray optics for textured crystalline-silicon solar cells and modules")
    .version(toolVersion())
    .showHelpAfterError("hint: run with --help for usage and examples")
    .configureOutput({ outputError: (text, write) => write(text.replace(/^error:/, "lightfold:")) })
    .exitOverride();
  for (const mod of commandModules) mod.register(program);
  program.addHelpText("after", GLOBAL_HELP);
  // Every verb documents the same exit codes.
  for (const cmd of program.commands) {
    cmd.exitOverride();
    cmd.configureOutput({ outputError: (text, write) => write(text.replace(/^error:/, "lightfold:")) });
    cmd.addHelpText("after", `\n${EXIT_CODES}`);
    refuseRepeatedOptions(cmd);
  }
  return program;
}

/** Verbs whose single-valued flags have a many-valued counterpart elsewhere. */
const REPEAT_HINTS: Record<string, string> = {
  yield: "one matrix and one site per run; `lightfold compare` takes two matrices and several sites",
};

/**
 * A flag that takes one value, given twice, would silently keep the last; refuse it instead.
 * Flags that collect their values (`--site` of compare, `--extra-sbatch`) are left alone.
 */
function refuseRepeatedOptions(cmd: Command): void {
  for (const opt of cmd.options) {
    if (opt.variadic || opt.parseArg !== undefined || !(opt.required || opt.optional)) continue;
    let count = 0;
    cmd.on(`option:${opt.name()}`, () => {
      count += 1;
      if (count === 2) {
        throw new InputError(
          `${opt.long ?? opt.flags} is given more than once; \`${cmd.name()}\` takes one value`,
          REPEAT_HINTS[cmd.name()] ?? `give ${opt.long ?? opt.flags} once (see \`lightfold ${cmd.name()} --help\`)`,
        );
      }
    });
  }
}

/** Fallback hint for an InputError that carries none: where the verb's usage and examples are. */
function helpHint(program: Command, argv: string[]): string {
  const names = new Set(program.commands.map((c) => c.name()));
  const verb = argv.slice(2).find((a) => names.has(a));
  return `run \`lightfold ${verb ?? ""}${verb ? " " : ""}--help\` for usage and examples`;
}

/**
 * Text safe for a terminal: control characters (ESC sequences could recolour or rewrite the screen)
 * shown as \u escapes; line breaks and tabs kept.
 */
export function printable(text: string): string {
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, "0")}`);
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
      process.stderr.write(`lightfold: ${printable(err.message)}\n`);
      process.stderr.write(`hint: ${printable(err.hint || helpHint(program, argv))}\n`);
      return EXIT_BAD_INPUT;
    }
    const message = err instanceof Error ? (err.stack ?? err.message) : String(err);
    process.stderr.write(`lightfold: failed: ${message}\n`);
    return EXIT_FAILURE;
  }
}
