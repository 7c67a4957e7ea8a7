import { closeSync, fsyncSync, openSync, readFileSync, renameSync, writeSync } from "node:fs";
import { sha256Hex } from "../study/canonical.js";
import { writeFileAtomic } from "../util/atomicWrite.js";

export const JOURNAL_FORMAT = "lightfold.journal";
export const JOURNAL_VERSION = 1;

/** First line of a journal: which study and tool wrote it. */
export interface JournalHeader {
  studyHash: string;
  toolVersion: string;
  buildId: string;
  /** [K, N] for shard K of N, null for a whole run. */
  shard: [number, number] | null;
}

/** Grid coordinates of a point: [combo, θ index, φ index, λ index]. */
export type PointKey = [number, number, number, number];

/**
 * A journal entry. "prefix": the point's tally folded over its batches 0 … nBatches−1 (in batch
 * order, from zero; a later prefix of the same point supersedes an earlier one). "batch": one
 * finished batch that could not be folded yet (an earlier batch of its point was still running).
 * Both record `planned`, the point's batch count at the time (target-error decisions so far).
 */
export type JournalEntry =
  | { kind: "prefix"; point: PointKey; nBatches: number; planned: number; nRays: number; tally: Float64Array; line?: number }
  | { kind: "batch"; point: PointKey; batch: number; planned: number; nRays: number; tally: Float64Array; line?: number };

export interface JournalContents {
  header: JournalHeader | undefined;
  entries: JournalEntry[];
  /** 1-based line numbers that were damaged (bad JSON, truncated, checksum mismatch) and ignored. */
  damagedLines: number[];
}

/** Checksum of one line's payload: first 16 hex digits of sha256. */
function checksum(body: string): string {
  return sha256Hex(body).slice(0, 16);
}

function sealLine(payload: object): string {
  const body = JSON.stringify(payload);
  return `${body.slice(0, -1)},"h":"${checksum(body)}"}\n`;
}

export function headerLine(h: JournalHeader): string {
  return sealLine({ format: JOURNAL_FORMAT, version: JOURNAL_VERSION, studyHash: h.studyHash, toolVersion: h.toolVersion, buildId: h.buildId, shard: h.shard });
}

export function entryLine(e: JournalEntry): string {
  return e.kind === "prefix"
    ? sealLine({ p: e.point, k: e.nBatches, m: e.planned, n: e.nRays, t: Array.from(e.tally) })
    : sealLine({ p: e.point, b: e.batch, m: e.planned, n: e.nRays, t: Array.from(e.tally) });
}

/** Parses one sealed line; undefined when damaged. */
function openLine(line: string): Record<string, unknown> | undefined {
  let o: Record<string, unknown>;
  try {
    o = JSON.parse(line) as Record<string, unknown>;
  } catch {
    return undefined;
  }
  if (o === null || typeof o !== "object" || typeof o.h !== "string") return undefined;
  const { h, ...rest } = o;
  return checksum(JSON.stringify(rest)) === h ? rest : undefined;
}

const isCount = (v: unknown): v is number => typeof v === "number" && Number.isInteger(v) && v >= 0;

function asEntry(o: Record<string, unknown>): JournalEntry | undefined {
  const p = o.p;
  const t = o.t;
  if (!Array.isArray(p) || p.length !== 4 || !p.every(isCount)) return undefined;
  if (!Array.isArray(t) || !t.every((v) => typeof v === "number")) return undefined;
  if (typeof o.n !== "number" || !isCount(o.m)) return undefined;
  const point = p as PointKey;
  const tally = Float64Array.from(t as number[]);
  if (isCount(o.k) && o.k > 0 && o.b === undefined) return { kind: "prefix", point, nBatches: o.k, planned: o.m, nRays: o.n, tally };
  if (isCount(o.b) && o.k === undefined) return { kind: "batch", point, batch: o.b, planned: o.m, nRays: o.n, tally };
  return undefined;
}

/** Reads a journal, keeping every sound entry and listing the damaged lines. */
export function readJournal(path: string): JournalContents {
  const text = readFileSync(path, "utf8");
  const lines = text.split("\n");
  // A file that does not end in a newline was cut mid-line: its last line is damaged even if it parses.
  const cut = !text.endsWith("\n");
  if (!cut) lines.pop();
  const damagedLines: number[] = [];
  const entries: JournalEntry[] = [];
  let header: JournalHeader | undefined;
  lines.forEach((line, i) => {
    const o = cut && i === lines.length - 1 ? undefined : openLine(line);
    if (i === 0) {
      if (o !== undefined && o.format === JOURNAL_FORMAT && o.version === JOURNAL_VERSION) {
        header = { studyHash: String(o.studyHash), toolVersion: String(o.toolVersion), buildId: String(o.buildId), shard: (o.shard ?? null) as JournalHeader["shard"] };
      } else damagedLines.push(1);
      return;
    }
    const e = o === undefined ? undefined : asEntry(o);
    if (e === undefined) damagedLines.push(i + 1);
    else entries.push({ ...e, line: i + 1 });
  });
  return { header, entries, damagedLines };
}

/** Moves a journal aside (never deleted: it is someone's compute time); returns the new name. */
export function setJournalAside(path: string, why: string): string {
  const stamp = new Date().toISOString().replace(/[:.]/g, "-");
  const aside = `${path}.${why}-${stamp}`;
  renameSync(path, aside);
  return aside;
}

/**
 * Append-only journal: each call to append() writes whole lines and fsyncs them, so after a crash
 * or kill -9 at most the lines being written are lost (and detected by their checksum).
 */
export class JournalWriter {
  private fd: number;
  /** Entries in the file (kept from the earlier run, then appended). */
  private entries: number;

  private constructor(readonly path: string, fd: number, kept: number) {
    this.fd = fd;
    this.entries = kept;
  }

  /** True while the journal holds no finished task (only its header). */
  get empty(): boolean {
    return this.entries === 0;
  }

  /**
   * Starts a journal with the header and the entries kept from an earlier run (rewritten atomically,
   * which also drops damaged lines and a cut last line), then opens it for appending.
   */
  static start(path: string, header: JournalHeader, kept: readonly JournalEntry[]): JournalWriter {
    writeFileAtomic(path, headerLine(header) + kept.map(entryLine).join(""));
    return new JournalWriter(path, openSync(path, "a"), kept.length);
  }

  append(entries: readonly JournalEntry[]): void {
    if (entries.length === 0) return;
    writeSync(this.fd, entries.map(entryLine).join(""));
    fsyncSync(this.fd);
    this.entries += entries.length;
  }

  close(): void {
    if (this.fd >= 0) {
      closeSync(this.fd);
      this.fd = -1;
    }
  }
}
