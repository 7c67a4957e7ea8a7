import { existsSync, mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { buildProgram } from "../../src/cli/main.js";
import { ROOT, runMain, spawnLightfold } from "../helpers/cli.js";

// Conventions of the command line (common practice for Unix tools): `--help` on every verb shows
// examples and the exit codes; bad input is one "lightfold: …" line plus one "hint: …" line on
// stderr, exit code 2 (0 ok, 1 failure, 2 bad input), nothing on stdout and nothing written.

const SITE = "configs/sites/brevenmark.site.json";
const STUDY = "configs/demo-planar.study.json";
const tmp = mkdtempSync(join(tmpdir(), "lightfold-cli-quality-"));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

const verbs = buildProgram().commands.map((c) => c.name());

describe("--help of every verb", () => {
  it("the program registers the verbs of the user guide", () => {
    for (const v of ["check", "trace", "sweep", "merge", "export", "spectral", "converge", "report", "weather", "yield", "compare", "materials", "film"]) {
      expect(verbs).toContain(v);
    }
  });

  it.each(verbs)("lightfold %s --help shows examples and the exit codes, exit 0", async (verb) => {
    const r = await runMain(verb, "--help");
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/Examples?:?/);
    expect(r.out).toContain(`lightfold ${verb}`);
    // each verb names all three codes (its own wording, e.g. "0 valid", "2 invalid", may vary)
    expect(r.out).toMatch(/Exit codes:\s+0 [^]*?1 failure[^]*?2 (bad input|invalid)/);
  });
});

/** Asserts the bad-input form: exit 2, two stderr lines ("lightfold: …", "hint: …"), no stdout. */
function expectBadInput(r: { code: number; out: string; err: string }, message: RegExp): void {
  expect(r.code, r.err).toBe(2);
  expect(r.out).toBe("");
  const lines = r.err.trimEnd().split("\n");
  expect(lines, r.err).toHaveLength(2);
  expect(lines[0]).toMatch(/^lightfold: /);
  expect(lines[0]).toMatch(message);
  expect(lines[1]).toMatch(/^hint: \S/);
}

describe("bad input: one line plus a hint, exit 2, nothing written", () => {
  const out = join(tmp, "out");
  const missing = join(tmp, "missing.json");

  beforeAll(() => {
    writeFileSync(
      join(tmp, "typo.study.json"),
      JSON.stringify({ name: "typo", stack: {}, grid: { thetaDeg: [0], phiDeg: [0], wavelengthNm: [600] }, rayz: { perPoint: 100 } }),
    );
  });

  const cases: Array<[string, string[], RegExp, RegExp?]> = [
    ["sweep: unreadable study file", ["sweep", missing, "--out", out, "--quiet"], /cannot read study file/, /configs\//],
    ["sweep: misspelt study field", ["sweep", join(tmp, "typo.study.json"), "--out", out, "--quiet"], /rayz: unknown field/, /did you mean "rays"\?/],
    ["check: unreadable study file", ["check", missing], /cannot read study file/],
    ["yield: unreadable matrix file", ["yield", "--matrix", missing, "--site", SITE, "--out", join(out, "y.json")], /cannot read response matrix file/, /lightfold sweep/],
    ["yield: unreadable site file", ["yield", "--matrix", missing, "--site", join(tmp, "nowhere.site.json"), "--out", join(out, "y.json")], /cannot read/],
    ["weather: unreadable site file", ["weather", "--site", join(tmp, "nowhere.site.json"), "--out", join(out, "w.csv")], /cannot read site file/, /configs\/sites/],
    ["export: unreadable matrix file", ["export", missing, "--format", "csv", "--out", join(out, "m.csv")], /cannot read response matrix file/],
    ["spectral: unreadable matrix file", ["spectral", missing], /cannot read response matrix file/],
    ["compare: one --matrix", ["compare", "--matrix", missing, "--site", SITE, "--out", join(out, "c.json")], /--matrix: give exactly two matrices/, /--matrix .* --matrix /],
    ["converge: no mode", ["converge", STUDY, "--out", out], /give exactly one of --wavelength <nm> or --spectral/, /--spectral/],
    ["trace: zero rays", ["trace", STUDY, "--rays", "0"], /--rays: expected a positive whole number/],
    ["export: unknown format", ["export", missing, "--format", "xls", "--out", join(out, "m.xls")], /--format/],
    ["an unknown option", ["sweep", STUDY, "--bogus"], /unknown option '--bogus'/, /--help/],
  ];

  it.each(cases)("%s", async (_label, args, message, hint) => {
    const r = await runMain(...args);
    expectBadInput(r, message);
    if (hint !== undefined) expect(r.err.trimEnd().split("\n")[1]).toMatch(hint);
    expect(existsSync(out), `${out} was created`).toBe(false);
    expect(readdirSync(tmp).sort()).toEqual(["typo.study.json"]);
  });

  it("the built program exits with status 2 (process exit code, not only main's return)", () => {
    expect(existsSync(join(ROOT, "dist", "src", "cli", "main.js")), "build first: npx tsc -p .").toBe(true);
    const r = spawnLightfold("compare", "--matrix", missing, "--site", SITE);
    expectBadInput({ code: r.status ?? -1, out: r.stdout, err: r.stderr }, /--matrix: give exactly two matrices/);
  });
});
