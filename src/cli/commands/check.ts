import type { Command } from "commander";
import { loadStudy } from "../../study/load.js";
import { formatStudySummary, summarizeStudy } from "../../study/summary.js";
import { loadTracer } from "../../workers/tracerModule.js";
import { InputError } from "../../util/errors.js";
import { comboChannels } from "../../sweep/channels.js";
import { nearestWord } from "../../util/didYouMean.js";

export function register(program: Command): void {
  program
    .command("check")
    .description("validate a study file without tracing: field-path errors, grid size, tasks, rays")
    .argument("<study>", "study file (JSON)")
    .option("--json", "print the summary as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold check configs/demo-random-pyramids.study.json
  lightfold check my.study.json --json

A study is valid when every field checks out and the stack compiles at every wavelength (exit 0);
an invalid one exits 2 with the field path and what was expected.`,
    )
    .action(async (studyPath: string, opts: { json?: boolean }) => {
      const study = loadStudy(studyPath);
      const tracer = await loadTracer();
      // Compile every combination's stack at every wavelength: catches materials whose tables do
      // not cover the grid before a run starts.
      const channels: Record<string, string[]> = {};
      for (const c of study.combos) {
        for (const wl of c.study.grid.wavelengthNm) {
          try {
            tracer.compileStack(c.study, study.registry, wl);
          } catch (err) {
            if (err instanceof InputError) {
              const where = c.label === "base" ? "" : ` (sweep combination ${c.label})`;
              throw new InputError(`${studyPath}: stack at ${wl} nm${where}: ${err.message}`, err.hint);
            }
            throw err;
          }
        }
        channels[c.label] = comboChannels(c.study, study.registry, tracer);
        const r = c.study.rays;
        if (r.mode === "target") {
          r.channels.forEach((name, i) => {
            if (!channels[c.label].includes(name)) {
              const near = nearestWord(name, channels[c.label]);
              throw new InputError(
                `${studyPath}: rays.channels[${i}]: the stack has no channel "${name}" (it has ${channels[c.label].join(", ")})`,
                near !== undefined ? `did you mean "${near}"?` : undefined,
              );
            }
          });
        }
      }
      const summary = summarizeStudy(study);
      if (opts.json) {
        process.stdout.write(JSON.stringify({ valid: true, ...summary, channels }, null, 2) + "\n");
        return;
      }
      const lines = formatStudySummary(study, summary);
      lines.push(`channels   ${channels[study.combos[0].label].join(", ")}`);
      process.stdout.write(`${studyPath}: valid\n${lines.map((l) => `  ${l}`).join("\n")}\n`);
    });
}
