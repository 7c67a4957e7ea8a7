/**
 * Renders the report of a tiny run in real headless Chromium (Debian's package, installed by .ci/run)
 * and checks what a reader sees: every plot present and non-empty, user text shown as text, no script
 * run. Saves test-artifacts/report.png. No network is used: the page is a local file.
 */
import { existsSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { pathToFileURL } from "node:url";
import { chromium, type BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { makeReport, type MakeReportResult } from "../../src/report/makeReport.js";
import { MODULE_CHANNELS, writeModuleRun, writeSweepRun } from "../fixtures/report/moduleRuns.js";
import { writeTinyRun, XSS_NAME } from "../fixtures/report/tinyRun.js";

const CHROMIUM = "/usr/bin/chromium";
const FLAGS = [
  "--headless",
  "--no-sandbox",
  "--disable-gpu",
  "--disable-quic",
  "--no-first-run",
  "--disable-background-networking",
  "--disable-component-update",
  "--disable-sync",
];

const tmp = mkdtempSync(join(tmpdir(), "lightfold-browser-"));
let context: BrowserContext;
let report: MakeReportResult;
let moduleReport: MakeReportResult;
let sweepReport: MakeReportResult;

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    // Fail, do not skip: .ci/run installs the browser, so its absence is a broken setup.
    throw new Error(
      `${CHROMIUM} not found: the report browser test needs Debian's chromium ` +
        "(apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium; .ci/run does this)",
    );
  }
  report = makeReport([writeTinyRun(join(tmp, "run"))], { angleDeg: 0 });
  moduleReport = makeReport([writeModuleRun(join(tmp, "module"))], { angleDeg: 0 });
  sweepReport = makeReport([writeSweepRun(join(tmp, "sweep"))], { angleDeg: 0 });
  // A fresh profile folder per run (playwright passes it as --user-data-dir).
  context = await chromium.launchPersistentContext(join(tmp, "profile"), {
    executablePath: CHROMIUM,
    headless: true,
    args: FLAGS,
    viewport: { width: 1280, height: 900 },
  });
});

afterAll(async () => {
  await context?.close();
  rmSync(tmp, { recursive: true, force: true });
});

/** Every text of every plot lies inside its SVG (nothing cut at an edge) and none is shortened with "…". */
async function labelsFit(page: import("playwright-core").Page): Promise<string[]> {
  return page.$$eval("svg[data-plot]", (svgs) =>
    svgs.flatMap((s) => {
      const box = s.getBoundingClientRect();
      return [...s.querySelectorAll("text")].flatMap((t) => {
        const b = t.getBoundingClientRect();
        const cut = b.right > box.right + 1 || b.left < box.left - 1 || (t.textContent ?? "").includes("…");
        return cut ? [`${s.getAttribute("data-plot")}: "${t.textContent}"`] : [];
      });
    }),
  );
}

describe("report page in headless Chromium", () => {
  it("shows every plot non-empty, renders the XSS study name as text, runs no script", async () => {
    const page = await context.newPage();
    const dialogs: string[] = [];
    page.on("dialog", (d) => {
      dialogs.push(d.message());
      void d.dismiss();
    });
    const requests: string[] = [];
    page.on("request", (r) => requests.push(r.url()));
    await page.goto(pathToFileURL(resolve(report.indexPath)).href, { waitUntil: "load" });

    const plots = await page.$$eval("svg[data-plot]", (svgs) =>
      svgs.map((s) => {
        const box = s.getBoundingClientRect();
        return {
          id: s.getAttribute("data-plot"),
          width: box.width,
          height: box.height,
          marks: s.querySelectorAll(".marks path, .marks rect, .marks circle").length,
          texts: s.querySelectorAll("text").length,
        };
      }),
    );
    expect(plots.map((p) => p.id)).toEqual(report.figures);
    for (const p of plots) {
      expect(p.width, `${p.id} width`).toBeGreaterThan(200);
      expect(p.height, `${p.id} height`).toBeGreaterThan(150);
      expect(p.marks, `${p.id} data marks`).toBeGreaterThan(0);
      expect(p.texts, `${p.id} labels`).toBeGreaterThan(5);
    }

    // The study name is visible as literal text in the heading; no script element exists.
    const heading = await page.locator("h1").innerText();
    expect(heading).toContain(XSS_NAME);
    expect(await page.locator(`h3:text-is("${XSS_NAME}")`).count()).toBe(1);
    expect(await page.$$eval("script", (s) => s.length)).toBe(0);
    expect(dialogs).toEqual([]);
    // Only the page itself was loaded: no network, no CDN.
    expect(requests.filter((u) => !u.startsWith("file://"))).toEqual([]);

    // no label of any plot is cut at an edge or shortened
    expect(await labelsFit(page)).toEqual([]);

    mkdirSync("test-artifacts", { recursive: true });
    await page.screenshot({ path: join("test-artifacts", "report.png"), fullPage: true });
    expect(existsSync(join("test-artifacts", "report.png"))).toBe(true);
    await page.close();
  });

  it("opens each standalone .svg file as a well-formed, non-empty image", async () => {
    const page = await context.newPage();
    for (const id of report.figures) {
      const file = join(resolve(report.indexPath, ".."), `${id}.svg`);
      await page.goto(pathToFileURL(file).href);
      const info = await page.evaluate(() => {
        const root = document.documentElement;
        const box = root.getBoundingClientRect();
        return { tag: root.tagName, parseError: document.getElementsByTagName("parsererror").length, width: box.width, height: box.height };
      });
      expect(info.parseError, `${id}.svg parses as XML`).toBe(0);
      expect(info.tag).toBe("svg");
      expect(info.width).toBeGreaterThan(200);
      expect(info.height).toBeGreaterThan(150);
    }
    await page.close();
  });

  it("a 14-channel module stack: every ledger step and spectral strip has its own colour and a label that fits", async () => {
    const page = await context.newPage();
    await page.goto(pathToFileURL(resolve(moduleReport.indexPath)).href, { waitUntil: "load" });
    const ledger = await page.$$eval('svg[data-plot^="ledger"] rect.step', (r) => r.map((e) => e.getAttribute("fill")));
    expect(ledger.length).toBe(MODULE_CHANNELS.length); // 13 losses + the absorber, none hidden
    expect(new Set(ledger).size).toBe(ledger.length);
    const strips = await page.$$eval('svg[data-plot^="spectral"] g.strip', (g) => g.map((e) => e.getAttribute("data-colour")));
    expect(strips.length).toBe(MODULE_CHANNELS.length);
    expect(new Set(strips).size).toBe(strips.length);
    const rows = await page.$$eval('svg[data-plot^="ledger"] text.row-label', (t) => t.map((e) => e.textContent));
    expect(rows).toContain("− cover glass (layer)");
    expect(rows).toContain("− SiO2 film on cover glass (#1)");
    expect(await labelsFit(page)).toEqual([]);
    await page.screenshot({ path: join("test-artifacts", "report-module.png"), fullPage: true });
    await page.close();
  });

  it("a 9-combination sweep: nine distinct series in the angular modifier, labelled by parameter and unit", async () => {
    const page = await context.newPage();
    await page.goto(pathToFileURL(resolve(sweepReport.indexPath)).href, { waitUntil: "load" });
    const legend = await page.$$eval('svg[data-plot="angular-modifier"] .legend line', (l) => l.map((e) => e.getAttribute("stroke")));
    const names = await page.$$eval('svg[data-plot="angular-modifier"] .legend text', (t) => t.map((e) => e.lastChild?.textContent ?? ""));
    expect(legend.length).toBe(9);
    expect(new Set(legend).size).toBe(9);
    expect(names).toContain("Si 140 µm · SiNx 75 nm");
    expect(new Set(names).size).toBe(9);
    const series = await page.$$eval('svg[data-plot="angular-modifier"] .marks .series path[stroke-linejoin]', (p) => p.map((e) => e.getAttribute("stroke")));
    expect(new Set(series).size).toBe(9);
    expect(await page.locator('svg[data-plot="parameter-sweep"] text.axis-label').first().textContent()).toMatch(/^(Si|SiNx) thickness \((µm|nm)\)$/);
    expect(await labelsFit(page)).toEqual([]);
    await page.screenshot({ path: join("test-artifacts", "report-sweep.png"), fullPage: true });
    await page.close();
  });
});
