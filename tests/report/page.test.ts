import { mkdtempSync, rmSync, writeFileSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { escapeText, html } from "../../src/report/escape.js";
import { loadReportInput } from "../../src/report/loadRunDir.js";
import { renderReport } from "../../src/report/page.js";
import { parameterSweepFigure } from "../../src/report/figures.js";
import { InputError } from "../../src/util/errors.js";
import { LAYER_NAME, writeTinyRun, XSS_NAME } from "../fixtures/report/tinyRun.js";

const tmp = mkdtempSync(join(tmpdir(), "lightfold-report-"));
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe("escapeText / html``", () => {
  it("escapes the five XML special characters (XML 1.0 §2.4)", () => {
    expect(escapeText(`<a href="x" title='y'>&</a>`)).toBe("&lt;a href=&quot;x&quot; title=&#39;y&#39;&gt;&amp;&lt;/a&gt;");
    expect(html`<p>${XSS_NAME}</p>`).toBe("<p>&lt;script&gt;alert(1)&lt;/script&gt;</p>");
  });
});

describe("renderReport(input) with user text that looks like markup", () => {
  const dir = writeTinyRun(join(tmp, "full"));
  const rendered = renderReport(loadReportInput([dir], { angleDeg: 0 }));

  it("never emits the study, layer or site names as markup", () => {
    const all = [rendered.html, ...rendered.figures.map((f) => f.svg)].join("\n");
    expect(all).not.toContain("<script");
    expect(all).not.toContain("<b>bold</b>");
    expect(all).not.toContain("<north>");
    expect(rendered.html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(rendered.html).toContain(escapeText(LAYER_NAME));
    // the page forbids scripts outright as a second line of defence
    expect(rendered.html).toContain("default-src 'none'");
  });

  it("has every plot, with file-safe ids", () => {
    const ids = rendered.figures.map((f) => f.id);
    expect(ids).toEqual([
      "ledger-1-script-alert-1-script",
      "spectral-1-script-alert-1-script",
      "ledger-2-planar-reference",
      "spectral-2-planar-reference",
      "passes-1-script-alert-1-script",
      "passes-2-planar-reference",
      "escape-angles",
      "generation-profile",
      "optimum-1-front-films-0-thicknessnm",
      "response-map-1-script-alert-1-script",
      "response-map-2-planar-reference",
      "angular-modifier",
      "convergence",
      "monthly-yield",
      "tilt-sweep",
    ]);
    for (const id of ids) expect(id).toMatch(/^[a-z0-9-]+$/);
    for (const f of rendered.figures) expect(rendered.html).toContain(`data-plot="${f.id}"`);
  });

  it("draws each legend entry with its series' dash and marker (convergence: solid and dashed, markers)", () => {
    const svg = rendered.figures.find((f) => f.id === "convergence")!.svg;
    const legend = /<g class="legend">(.*?)<\/g>/s.exec(svg)![1]!;
    const dashedSeries = /<path d="[^"]+" stroke="([^"]+)" stroke-width="1.6" fill="none" stroke-dasharray="6 4"/.exec(svg)!;
    expect(legend).toContain(`stroke="${dashedSeries[1]}" stroke-width="1.6" stroke-dasharray="6 4"`);
    // markers in the legend are the same symbols as on the lines
    const marker = /<path d="(M[^"]+)" transform="translate\([^)]*\)" fill="([^"]+)"/.exec(/<g class="marks"[^>]*>(.*)<\/g><g class="axes"/s.exec(svg)![1]!)!;
    expect(legend).toContain(`d="${marker[1]}"`);
  });

  it("references nothing outside the page (no network, no CDN)", () => {
    expect(rendered.html).not.toMatch(/\b(src|href)="(https?:)?\/\//);
    expect(rendered.html).not.toMatch(/@import|url\(\s*['"]?https?:/);
  });

  it("draws one heat-map cell per (θ, λ) point", () => {
    const map = rendered.figures.find((f) => f.id.startsWith("response-map-1"))!;
    const marks = /<g class="marks"[^>]*>(.*?)<\/g>/s.exec(map.svg)![1]!;
    expect(marks.match(/<rect /g)!.length).toBe(4 * 19);
  });

  it("the photon ledger walks from the incident current to the absorber: incident − Σ losses = absorber", () => {
    // Σ channels = 1 at each wavelength ⇒ the channel currents add up to the current of all photons in the range
    const svg = rendered.figures.find((f) => f.id.startsWith("ledger-1"))!.svg;
    // values under 0.005 print as "<0.01" (counted as 0 here)
    const values = [...svg.matchAll(/<text [^>]*>(−?)(&lt;)?([0-9.]+)(?: ± [0-9.]+)?(?: mA\/cm²)?(?: · [0-9.]+ %| \((?:&lt;)?[0-9.]+ %\))<\/text>/g)].map((m) => (m[2] ? 0 : Number(m[3]) * (m[1] ? -1 : 1)));
    const [incident, ...rest] = values;
    const absorber = rest.pop()!;
    expect(rest.length).toBe(7); // R_first, R_escape, T_first, SiNx film, layer, rear reflector, unresolved (all carry current here)
    expect(incident! + rest.reduce((s, v) => s + v, 0)).toBeCloseTo(absorber, 1);
    expect(svg).toContain("incident photon current");
    expect(svg).toContain("= absorber photocurrent");
    expect(svg).not.toContain("total (incident");
  });

  it("draws one spectral strip per channel that carries light, each labelled in place, and names the empty ones", () => {
    const svg = rendered.figures.find((f) => f.id.startsWith("spectral-1"))!.svg;
    const labels = [...svg.matchAll(/class="strip-label">([^<]+)</g)].map((m) => m[1]);
    expect(labels[0]).toBe("absorber");
    expect(labels).toContain("reflected before entering the absorber");
    expect(labels).toContain("entered, then left through the front");
    expect(svg.match(/<g class="strip"/g)!.length).toBe(labels.length);
    const empty = renderReport(loadReportInput([writeTinyRun(join(tmp, "strips"), { matricesOnly: true })], { angleDeg: 0 }));
    expect(empty.figures.length).toBeGreaterThan(0);
  });

  it("reads yield, tilt-sweep and comparison files and notes the ones of another kind", () => {
    const input = loadReportInput([dir], { angleDeg: 0 });
    expect(input.yields.map((y) => `${y.stackLabel}@${y.tiltDeg}`)).toEqual([`${XSS_NAME}@20`, `${XSS_NAME}@40`, "planar reference@20", "planar reference@40"]);
    expect(input.tiltSweeps.map((t) => t.bestTiltDeg)).toEqual([40, 40]);
    expect(input.benefit.map((b) => b.stackA)).toEqual([XSS_NAME, XSS_NAME]);
    expect(rendered.html).toMatch(/Skipped [^<]*notes\.json: not a yield/);
    const benefit = /<table class="benefit">(.*?)<\/table>/s.exec(rendered.html)![1]!;
    expect(benefit.match(/<tr>/g)!.length).toBe(3); // header + two tilts
    // which error each ± is: paired where the file says so, a dash for files without the field
    expect(input.benefit.map((b) => b.errorKind)).toEqual(["paired", undefined]);
    expect(benefit).toMatch(/<th class="text">s\.e\. from<\/th>/);
    expect(benefit).toMatch(/<td class="text">paired<\/td><\/tr>.*<td class="text">–<\/td><\/tr>/s);
  });
});

describe("sections without data", () => {
  it("are omitted with a note, not broken", () => {
    const dir = writeTinyRun(join(tmp, "bare"), { matricesOnly: true });
    const r = renderReport(loadReportInput([dir], { angleDeg: 30 }));
    expect(r.figures.map((f) => f.id)).not.toContain("convergence");
    expect(r.figures.map((f) => f.id)).not.toContain("monthly-yield");
    expect(r.html).toContain("Omitted: no convergence.json");
    expect(r.html).toContain("Omitted: no yield results");
    expect(r.html).toContain("Omitted: no comparison");
    expect(r.html).toContain("Photon ledger at θ = 30°");
    expect(r.html).toContain("Where each wavelength ends up at θ = 30°");
  });
});

describe("loadReportInput errors", () => {
  const dir = writeTinyRun(join(tmp, "errs"), { matricesOnly: true });
  it("names a missing folder", () => {
    expect(() => loadReportInput([join(tmp, "nope")], { angleDeg: 0 })).toThrow(InputError);
  });
  it("names the angle grid when --angle is off it", () => {
    expect(() => loadReportInput([dir], { angleDeg: 45 })).toThrow(/not in the matrix grid \(θ = 0, 30, 60, 80°\)/);
  });
  it("names the file and field of a malformed photocurrent summary", () => {
    const p = join(dir, "base", "photocurrent.json");
    const good = readFileSync(p, "utf8");
    const bad = JSON.parse(good);
    bad.directions[1].jscMaCm2 = "lots";
    writeFileSync(p, JSON.stringify(bad));
    try {
      expect(() => loadReportInput([dir], { angleDeg: 0 })).toThrow(/photocurrent\.json: field "directions\[1\]\.jscMaCm2" must be a finite number/);
    } finally {
      writeFileSync(p, good);
    }
  });
  it("names the file and field of a comparison row whose error kind is neither paired nor independent", () => {
    const full = writeTinyRun(join(tmp, "errs-kind"));
    const p = join(full, "yield", "compare.json");
    const doc = JSON.parse(readFileSync(p, "utf8"));
    doc.rows[1].benefitErrorKind = "guessed";
    writeFileSync(p, JSON.stringify(doc));
    expect(() => loadReportInput([full], { angleDeg: 0 })).toThrow(/compare\.json: field "rows\[1\]\.benefitErrorKind" must be "paired" or "independent" \(found "guessed"\)/);
  });
  it("refuses a folder with no results", () => {
    const empty = join(tmp, "empty");
    writeTinyRun(empty, { matricesOnly: true });
    rmSync(join(empty, "base"), { recursive: true });
    rmSync(join(empty, "p0"), { recursive: true });
    rmSync(join(empty, "run.json"));
    expect(() => loadReportInput([empty], { angleDeg: 0 })).toThrow(/holds no lightfold results/);
  });
});

describe("parameterSweepFigure(stacks, angle)", () => {
  it("plots the photocurrent over a swept parameter and circles the highest", () => {
    const base = loadReportInput([writeTinyRun(join(tmp, "sweep"), { matricesOnly: true })], { angleDeg: 0 }).stacks;
    const stacks = [100, 140, 180].map((t, i) => ({
      ...base[i % 2]!,
      studyName: "thick",
      comboKey: `p${i}`,
      combo: { "absorber.thicknessUm": t },
    }));
    const fig = parameterSweepFigure(stacks, 0)!;
    expect(fig.id).toBe("parameter-sweep");
    // p1 is the planar copy (lower current), so the best is one of the textured copies: 100 or 180 (same value; first wins)
    expect(fig.svg).toContain(">best 100<");
    expect(parameterSweepFigure(stacks.slice(0, 2), 0)).toBeNull();
  });
});
