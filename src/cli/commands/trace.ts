import type { Command } from "commander";
import { loadStudy } from "../../study/load.js";
import { RandomStream, streamKey } from "../../random/stream.js";
import { InputError } from "../../util/errors.js";
import { compileStack } from "../../trace/compile.js";
import type { Estimator } from "../../trace/compiledStack.js";
import { estimatorAt, traceBatch, type Polarization } from "../../trace/kernel.js";
import { createTally, summarizeTally, type TallySummary } from "../../trace/tally.js";
import { lambertianLimit, summarizeTrapping, type TrappingSummary } from "../../trace/trappingSummary.js";
import type { CompiledStack } from "../../trace/compiledStack.js";
import { LaunchPoints } from "../../trace/launchPoints.js";
import { trappingWithReplicaErrors, withReplicaErrors } from "../../trace/replicaSummary.js";
import { ScrambledSobol } from "../../random/sobol.js";
import { REPLICA_GROUPS } from "../../random/replicaGroups.js";
import { samplingFlag } from "../samplingFlag.js";
import { defaultSampling } from "../../study/rays.js";

interface TraceOptions {
  angle: string;
  azimuth: string;
  wavelength: string;
  rays: string;
  seed?: string;
  polarization: string;
  estimator: string;
  sampling?: string;
  combo: string;
  json?: boolean;
}

function numberOption(name: string, text: string, check: (v: number) => boolean, expected: string): number {
  const v = Number(text);
  if (text.trim() === "" || !Number.isFinite(v) || !check(v)) throw new InputError(`--${name}: expected ${expected}, got "${text}"`, "run `lightfold trace --help` for each flag's form and examples");
  return v;
}

export function register(program: Command): void {
  program
    .command("trace")
    .description("trace one incidence direction at one wavelength and print where the light goes, with Monte Carlo errors")
    .argument("<study>", "study file (JSON); its stack is traced")
    .option("--angle <deg>", "polar angle of incidence θ in degrees, [0, 90)", "0")
    .option("--azimuth <deg>", 'azimuth φ in degrees, or "averaged" (random per ray)', "0")
    .option("--wavelength <nm>", "vacuum wavelength in nm", "1000")
    .option("--rays <n>", "number of rays", "100000")
    .option("--seed <n>", "seed of the random stream (default: the study's seed)")
    .option("--polarization <kind>", "unpolarized, s or p (relative to the plane of incidence)", "unpolarized")
    .option("--estimator <kind>", "default (chosen per wavelength), expected (expected-value weights) or analog", "default")
    .option("--sampling <kind>", "launch sampling: random or sobol (16 scrambled Sobol' replicas; default: the study's if it names one, else Sobol' when --rays fills 16+ of its batches)")
    .option("--combo <i>", "sweep combination index (0 = first)", "0")
    .option("--json", "print the result as JSON")
    .addHelpText(
      "after",
      `
Examples:
  lightfold trace configs/bench-pyramids.study.json --angle 30 --wavelength 1000
  lightfold trace my.study.json --angle 60 --azimuth averaged --rays 20000 --seed 7 --json

Channels: R_first (reflected before ever entering the absorber: cover layers, films, front
interface), R_escape (entered the absorber, later left through the front), T_first / T_escape
(left through a transparent rear on the first pass / after being turned back), A_absorber,
A_layer:<name>, A_film:<where>:<i>:<material>, A_rear (rear metal or ideal reflector),
unresolved (bounce limit). Each mean comes with its standard error from per-ray contributions, or
under Sobol' launch points (the default when --rays fills 16 or more of the study's batches, as a
sweep point would; --sampling names it) from the spread of 16 independently scrambled replicas.
Below the channels: the power that entered the absorber, the fraction of it still inside after
1, 2, 3 … passes, the path enhancement with the absorber's absorption removed (α → 0) against
4n² (Yablonovitch 1982), and the photon path per incident photon (shortened by absorption).`,
    )
    .action((studyPath: string, opts: TraceOptions) => {
      const thetaDeg = numberOption("angle", opts.angle, (v) => v >= 0 && v < 90, "a polar angle in [0, 90) degrees");
      const phiDeg = opts.azimuth === "averaged" ? null : numberOption("azimuth", opts.azimuth, () => true, 'degrees or "averaged"');
      const wavelengthNm = numberOption("wavelength", opts.wavelength, (v) => v > 0, "a wavelength in nm");
      const nRays = numberOption("rays", opts.rays, (v) => Number.isInteger(v) && v >= 1, "a positive whole number");
      if (!["unpolarized", "s", "p"].includes(opts.polarization)) {
        throw new InputError(`--polarization: expected unpolarized, s or p, got "${opts.polarization}"`, "e.g. --polarization s");
      }
      if (opts.estimator !== "default" && opts.estimator !== "expected" && opts.estimator !== "analog") {
        throw new InputError(
          `--estimator: expected "default", "expected" or "analog", got "${opts.estimator}"`,
          "default (the tracer's choice at this wavelength), expected (expected-value weights) or analog, e.g. --estimator analog",
        );
      }
      const loaded = loadStudy(studyPath);
      const comboIndex = numberOption("combo", opts.combo, (v) => Number.isInteger(v) && v >= 0 && v < loaded.combos.length, `an index below ${loaded.combos.length}`);
      const combo = loaded.combos[comboIndex];
      const seed = opts.seed === undefined ? combo.study.seed : numberOption("seed", opts.seed, Number.isInteger, "a whole number");

      // Unnamed in the flag and the study: the sweep's rule for a point of nRays in the study's batches.
      const written = loaded.raysAsWritten;
      const sampling = samplingFlag(opts.sampling) ?? written.sampling ?? defaultSampling({ perPoint: nRays, batch: written.batch });
      let cs;
      try {
        cs = compileStack(combo.study, loaded.registry, wavelengthNm, { estimator: opts.estimator === "default" ? undefined : (opts.estimator as Estimator), launchSampling: sampling });
      } catch (err) {
        if (err instanceof InputError) throw new InputError(`${studyPath}: at ${wavelengthNm} nm: ${err.message}`, err.hint);
        throw err;
      }
      if (sampling === "sobol" && nRays < REPLICA_GROUPS) {
        throw new InputError(
          `--rays ${nRays}: Sobol' sampling traces ${REPLICA_GROUPS} independent replicas and needs at least ${REPLICA_GROUPS} rays`,
          opts.sampling === undefined ? "e.g. --rays 16384, or --sampling random (the study names Sobol' launch points)" : "e.g. --rays 16384",
        );
      }
      const key = streamKey(seed, "trace", thetaDeg, phiDeg ?? "averaged", wavelengthNm);
      const t0 = process.hrtime.bigint();
      const { s, trap } = sampling === "sobol"
        ? traceReplicas(cs, thetaDeg, phiDeg, nRays, key, opts.polarization as Polarization)
        : traceOnce(cs, thetaDeg, phiDeg, nRays, key, opts.polarization as Polarization);
      const seconds = Number(process.hrtime.bigint() - t0) * 1e-9;
      const nAbs = cs.mediumN[cs.nLayers + 1];
      // The α → 0 tally divides by bulk survival; it is well behaved while 4n²αW stays small.
      const alphaW = cs.mediumAlphaPerUm[cs.nLayers + 1] * cs.thicknessUm;
      const weak = lambertianLimit(nAbs) * alphaW < 1;
      let sum = 0;
      for (let c = 0; c < s.mean.length; c++) sum += s.mean[c];

      if (opts.json) {
        const channels: Record<string, { mean: number; stderr: number }> = {};
        cs.channels.forEach((name, c) => (channels[name] = { mean: s.mean[c], stderr: s.stderr[c] }));
        const out = {
          study: loaded.name,
          combo: combo.label,
          thetaDeg,
          phiDeg: phiDeg ?? "averaged",
          wavelengthNm,
          nRays,
          seed,
          polarization: opts.polarization,
          estimator: estimatorAt(cs, thetaDeg),
          sampling,
          channels,
          channelSum: sum,
          photonPathRatio: { mean: s.pathRatio, stderr: s.pathRatioStderr },
          trapping: {
            entered: trap.entered,
            freePathRatio: trap.freePathRatio,
            lambertianLimit: lambertianLimit(nAbs),
            alphaW,
            weakAbsorption: weak,
            passRemaining: trap.passRemaining,
            passTail: trap.passTail,
            escapeAngleBinDeg: trap.escapeAngleBinDeg,
            escapeAngle: trap.escapeAngle,
          },
          eventsPerRay: s.eventsPerRay,
          seconds,
        };
        process.stdout.write(JSON.stringify(out, null, 2) + "\n");
        return;
      }
      const w = Math.max(10, ...cs.channels.map((c) => c.length));
      const lines = [
        `${loaded.name}${combo.label === "base" ? "" : ` (combination ${combo.label})`}`,
        `  front: ${cs.frontTile.label}; absorber ${cs.stack.absorber.material} ${cs.thicknessUm} µm; boundary ${cs.stack.boundary}`,
        `  θ = ${thetaDeg}°, φ = ${phiDeg === null ? "averaged" : `${phiDeg}°`}, λ = ${wavelengthNm} nm, ${nRays} rays, seed ${seed}, ${opts.polarization}, ${estimatorAt(cs, thetaDeg) === "expected" ? "expected-value" : "analog"} estimator${sampling === "sobol" ? `, Sobol' launch points (errors from ${REPLICA_GROUPS} replicas)` : ""}`,
        "",
        `  ${"channel".padEnd(w)}  ${"mean".padStart(9)}  ${"std.err".padStart(9)}`,
        ...cs.channels.map((name, c) => `  ${name.padEnd(w)}  ${s.mean[c].toFixed(6).padStart(9)}  ${s.stderr[c].toFixed(6).padStart(9)}`),
        `  ${"sum".padEnd(w)}  ${sum.toFixed(6).padStart(9)}`,
        "",
        `  entered the absorber: ${trap.entered.mean.toFixed(6)} ± ${trap.entered.stderr.toFixed(6)} of the incident power`,
        `  still inside after pass 1…5: ${trap.passRemaining.slice(0, 5).map((e) => e.mean.toFixed(4)).join(", ")} (of the entered power)`,
        `  path enhancement with absorption removed (α → 0): ${trap.freePathRatio.mean.toFixed(2)} ± ${trap.freePathRatio.stderr.toFixed(2)} × thickness (4n² = ${lambertianLimit(nAbs).toFixed(1)}, n = ${nAbs.toFixed(3)}; αW = ${alphaW.toPrecision(3)}${weak ? "" : ": not weak, the importance weights are heavy-tailed here, read it at a weakly absorbing wavelength"})`,
        `  photon path in absorber per incident photon (until absorbed or out): ${s.pathRatio.toFixed(3)} ± ${s.pathRatioStderr.toFixed(3)} × thickness`,
        `  events per ray: ${s.eventsPerRay.toFixed(2)}; ${(nRays / seconds).toFixed(0)} rays/s on one thread`,
      ];
      process.stdout.write(lines.join("\n") + "\n");
    });
}

interface Traced {
  s: TallySummary;
  trap: TrappingSummary;
}

/** All rays on one stream (ray r on substream r); errors from per-ray contributions. */
function traceOnce(cs: CompiledStack, thetaDeg: number, phiDeg: number | null, nRays: number, key: string, polarization: Polarization): Traced {
  const tally = createTally(cs);
  traceBatch(cs, thetaDeg, phiDeg, nRays, new RandomStream(key), tally, polarization);
  return { s: summarizeTally(cs.channels, tally), trap: summarizeTrapping(tally, cs.channels.length) };
}

/**
 * Sobol' launch points: REPLICA_GROUPS replicas of about nRays/16 rays, each with its own stream and
 * its own scramble; means from the pooled tally, standard errors from the spread of the replicas.
 */
function traceReplicas(cs: CompiledStack, thetaDeg: number, phiDeg: number | null, nRays: number, key: string, polarization: Polarization): Traced {
  const pooled = createTally(cs);
  const perReplica = Math.ceil(nRays / REPLICA_GROUPS);
  const sums: TallySummary[] = [];
  const traps: TrappingSummary[] = [];
  const counts: number[] = [];
  for (let g = 0, done = 0; done < nRays; g++) {
    const n = Math.min(perReplica, nRays - done);
    const tally = createTally(cs);
    const launch = new LaunchPoints(new ScrambledSobol(`${key}/sobol/${g}`), 0);
    traceBatch(cs, thetaDeg, phiDeg, n, new RandomStream(`${key}/replica/${g}`), tally, polarization, "front", launch);
    for (let i = 0; i < tally.length; i++) pooled[i] += tally[i];
    sums.push(summarizeTally(cs.channels, tally));
    traps.push(summarizeTrapping(tally, cs.channels.length));
    counts.push(n);
    done += n;
  }
  return {
    s: withReplicaErrors(summarizeTally(cs.channels, pooled), sums, counts),
    trap: trappingWithReplicaErrors(summarizeTrapping(pooled, cs.channels.length), traps, counts),
  };
}
