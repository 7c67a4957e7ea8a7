import { closeSync, existsSync, mkdirSync, openSync, readdirSync, readFileSync, rmSync, statSync, writeSync } from "node:fs";
import { hostname } from "node:os";
import { join } from "node:path";
import { InputError } from "./errors.js";

export const LOCK_FILE = ".lightfold.lock";
/** Temporary files of writeFileAtomic: `.<name>.<pid>.<ms>.tmp`. */
const TEMP_FILE = /^\..+\.(\d+)\.\d+\.tmp$/;

interface LockRecord {
  pid: number;
  host: string;
  startedAt: string;
  what: string;
}

/** An exclusive lock on an output folder, held by this process until release(). */
export interface OutputLock {
  path: string;
  release(): void;
}

const held = new Set<OutputLock>();

/** Releases every lock this process holds (for a signal handler that ends the process). */
export function releaseAllLocks(): void {
  for (const l of [...held]) l.release();
}

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === "EPERM";
  }
  return !zombie(pid);
}

/**
 * A process that has exited but is not yet reaped by its parent (e.g. a run killed under `timeout
 * -s KILL`, which dies with it) still answers kill(pid, 0), but holds nothing. On Linux its state in
 * /proc/<pid>/stat is Z (zombie) or X (dead) (proc(5): the third field, after the command name in
 * parentheses); elsewhere the file is missing and the process counts as alive.
 */
function zombie(pid: number): boolean {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    const state = stat.charAt(stat.lastIndexOf(")") + 2);
    return state === "Z" || state === "X";
  } catch {
    return false;
  }
}

function readRecord(path: string): LockRecord | undefined {
  try {
    const o = JSON.parse(readFileSync(path, "utf8")) as Partial<LockRecord>;
    if (typeof o.pid === "number" && Number.isInteger(o.pid) && typeof o.host === "string") {
      return { pid: o.pid, host: o.host, startedAt: String(o.startedAt), what: String(o.what) };
    }
  } catch {
    // unreadable: treated as stale below
  }
  return undefined;
}

/**
 * Takes the exclusive lock of an output folder (file `<dir>/.lightfold.lock` created with O_EXCL,
 * holding the pid, host and start time). A lock of a live process refuses with its holder named; a
 * stale one (its process gone on this host, or unreadable) is named through onNotice and taken over.
 */
export function lockOutputDir(dir: string, what: string, onNotice: (m: string) => void = () => {}): OutputLock {
  if (existsSync(dir) && !statSync(dir).isDirectory()) throw new InputError(`${dir}: the output folder is a file; choose another --out`);
  mkdirSync(dir, { recursive: true });
  const path = join(dir, LOCK_FILE);
  const record: LockRecord = { pid: process.pid, host: hostname(), startedAt: new Date().toISOString(), what };
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = openSync(path, "wx");
      writeSync(fd, JSON.stringify(record) + "\n");
      closeSync(fd);
      const lock: OutputLock = {
        path,
        release: () => {
          if (!held.delete(lock)) return;
          if (readRecord(path)?.pid === process.pid) rmSync(path, { force: true });
        },
      };
      held.add(lock);
      return lock;
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== "EEXIST") throw err;
    }
    const other = readRecord(path);
    if (other !== undefined && (other.host !== record.host || alive(other.pid))) {
      const where = other.host === record.host ? `pid ${other.pid}` : `pid ${other.pid} on host ${other.host}`;
      throw new InputError(
        `${dir}: in use by another lightfold run (${other.what}, ${where}, started ${other.startedAt}); two runs must not write one folder`,
        `wait for it to finish or choose another --out; if that process is gone, delete ${path}`,
      );
    }
    onNotice(other === undefined
      ? `removed an unreadable lock ${path}`
      : `removed a stale lock ${path} (${other.what}, pid ${other.pid}, started ${other.startedAt}; that process is no longer running)`);
    rmSync(path, { force: true });
  }
  throw new InputError(`${dir}: could not take the output folder's lock ${path}`);
}

/**
 * Removes temporary files that interrupted atomic writes left in `dir` and its direct subfolders
 * (not `skip`); only those of processes no longer running. Returns how many were removed.
 */
export function removeStaleTempFiles(dir: string, skip: readonly string[] = []): number {
  let removed = 0;
  const visit = (d: string, depth: number): void => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      const m = TEMP_FILE.exec(e.name);
      if (e.isFile() && m !== null && (Number(m[1]) === process.pid ? false : !alive(Number(m[1])))) {
        rmSync(join(d, e.name), { force: true });
        removed++;
      } else if (e.isDirectory() && depth > 0 && !skip.includes(e.name)) visit(join(d, e.name), depth - 1);
    }
  };
  if (existsSync(dir)) visit(dir, 1);
  return removed;
}
