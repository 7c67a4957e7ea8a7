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

beforeAll(async () => {
  if (!existsSync(CHROMIUM)) {
    // Fail, do not skip: .ci/run installs the browser, so its absence is a broken setup.
    throw new Error(
      `${CHROMIUM} not found: the report browser test needs Debian's chromium ` +
        "(apt-get update && DEBIAN_FRONTEND=noninteractive apt-get install -y chromium; .ci/run does this)",
    );
  }
  report = makeReport([writeTinyRun(join(tmp, "run"))], { angleDeg: 0 });
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
});
