import cliProgress from "cli-progress";
import type { SweepProgress } from "./runSweep.js";

export interface ProgressReporter {
  update(p: SweepProgress): void;
  stop(): void;
}

function formatDuration(s: number): string {
  if (!Number.isFinite(s) || s < 0) return "?";
  if (s < 60) return `${Math.round(s)}s`;
  if (s < 3600) return `${Math.floor(s / 60)}m${String(Math.round(s % 60)).padStart(2, "0")}s`;
  return `${Math.floor(s / 3600)}h${String(Math.floor((s % 3600) / 60)).padStart(2, "0")}m`;
}

function formatCount(n: number): string {
  if (n >= 1e9) return `${(n / 1e9).toFixed(2)}G`;
  if (n >= 1e6) return `${(n / 1e6).toFixed(2)}M`;
  if (n >= 1e3) return `${(n / 1e3).toFixed(1)}k`;
  return String(Math.round(n));
}

/** Rate and remaining time from the rays traced by this process (resumed rays cost nothing). */
function rateEta(p: SweepProgress): { rate: number; eta: number } {
  const rate = p.elapsedS > 0 ? p.raysTracedNow / p.elapsedS : 0;
  const eta = rate > 0 ? (p.raysPlanned - p.raysDone) / rate : Infinity;
  return { rate, eta };
}

/** One plain line, for logs and non-TTY output. */
export function progressLine(p: SweepProgress): string {
  const { rate, eta } = rateEta(p);
  const pct = p.raysPlanned > 0 ? (100 * p.raysDone) / p.raysPlanned : 100;
  return `rays ${formatCount(p.raysDone)}/${formatCount(p.raysPlanned)} (${pct.toFixed(1)}%), points ${p.pointsDone}/${p.pointsTotal}, ` +
    `${formatCount(rate)} rays/s, elapsed ${formatDuration(p.elapsedS)}, ETA ${formatDuration(eta)}`;
}

/**
 * Progress on stderr: a cli-progress bar on a terminal, a plain line every `intervalS` seconds
 * otherwise (batch logs), nothing when quiet.
 */
export function createProgressReporter(mode: "auto" | "quiet", stream: NodeJS.WriteStream = process.stderr, intervalS = 10): ProgressReporter {
  if (mode === "quiet") return { update: () => {}, stop: () => {} };
  if (stream.isTTY === true) {
    const bar = new cliProgress.SingleBar(
      {
        format: " {bar} {percentage}% | rays {raysDone}/{raysPlanned} | points {pointsDone}/{pointsTotal} | {rate} rays/s | ETA {etaText}",
        hideCursor: true,
        stream,
        etaBuffer: 50,
        noTTYOutput: false,
      },
      cliProgress.Presets.shades_classic,
    );
    let started = false;
    return {
      update(p) {
        const { rate, eta } = rateEta(p);
        const payload = {
          raysDone: formatCount(p.raysDone),
          raysPlanned: formatCount(p.raysPlanned),
          pointsDone: p.pointsDone,
          pointsTotal: p.pointsTotal,
          rate: formatCount(rate),
          etaText: formatDuration(eta),
        };
        if (!started) {
          bar.start(p.raysPlanned, p.raysDone, payload);
          started = true;
        } else {
          bar.setTotal(p.raysPlanned);
          bar.update(p.raysDone, payload);
        }
      },
      stop() {
        if (started) bar.stop();
      },
    };
  }
  let last = -Infinity;
  let latest: SweepProgress | undefined;
  return {
    update(p) {
      latest = p;
      if (p.elapsedS - last >= intervalS) {
        last = p.elapsedS;
        stream.write(`lightfold sweep: ${progressLine(p)}\n`);
      }
    },
    stop() {
      if (latest !== undefined && latest.elapsedS !== last) stream.write(`lightfold sweep: ${progressLine(latest)}\n`);
    },
  };
}
