import { existsSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { ROOT, spawnLightfold as lightfold } from "../helpers/cli.js";

beforeAll(() => {
  expect(existsSync(join(ROOT, "dist", "src", "cli", "commands", "materials.js")), "build first: npx tsc -p .").toBe(true);
});

describe("lightfold materials", () => {
  it("lists the built-ins with range, n and k at 600 nm and source", () => {
    const r = lightfold("materials");
    expect(r.status).toBe(0);
    const line = r.stdout.split("\n").find((l) => l.startsWith("Si-Green2008"))!;
    expect(line).toContain("250–1450 nm");
    expect(line).toContain("3.9400"); // n(600 nm), Green 2008 table
    expect(line).toContain("Green 2008");
  });

  it("--json lists every built-in with n, k at 600 nm (null outside range)", () => {
    const r = lightfold("materials", "--json");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { materials: Array<{ name: string; n: number | null; k: number | null }>; aliases: Record<string, string> };
    const si = out.materials.find((m) => m.name === "Si-Schinke2015")!;
    expect(si.n).toBe(3.931); // Schinke 2015 table at 600 nm
    expect(si.k).toBe(0.018521);
    expect(out.aliases.Si).toBe("Si-Green2008");
  });

  it("prints n, k and alpha = 4πk/λ of one material", () => {
    const r = lightfold("materials", "Si", "--wavelength", "1000", "--json");
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { name: string; values: Array<{ n: number; k: number; alphaPerCm: number }> };
    expect(out.name).toBe("Si-Green2008");
    expect(out.values[0]!.k).toBe(5.093e-4);
    expect(out.values[0]!.alphaPerCm).toBeCloseTo((4 * Math.PI * 5.093e-4) / 1e-4, 9);
    const text = lightfold("materials", "SiNx", "--wavelength", "600,633");
    expect(text.status).toBe(0);
    expect(text.stdout).toContain("SiNx-Vogt2015-n2.09 (alias SiNx)");
  });

  it("exits 2 with a did-you-mean message on an unknown name", () => {
    const r = lightfold("materials", "Si-Gren2008");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('unknown material "Si-Gren2008"');
    expect(r.stderr).toContain("Si-Green2008");
    expect(r.stdout).toBe("");
  });

  it("exits 2 naming the range for a wavelength outside it, and for a malformed wavelength", () => {
    const r = lightfold("materials", "Si", "--wavelength", "1600");
    expect(r.status).toBe(2);
    expect(r.stderr).toContain("250–1450 nm");
    expect(lightfold("materials", "Si", "--wavelength", "six hundred").status).toBe(2);
  });

  it("--csv inspects a user table and reports a bad one with its line (exit 2)", () => {
    const dir = mkdtempSync(join(tmpdir(), "lightfold-cli-"));
    writeFileSync(join(dir, "good.csv"), "wavelength_nm,n,k\n500,2.0,1e-3\n700,1.9,1e-5\n");
    writeFileSync(join(dir, "bad.csv"), "wavelength_nm,n,k\n500,2.0,1e-3\n700,1.9,-1e-5\n");
    const ok = lightfold("materials", "--csv", join(dir, "good.csv"), "--wavelength", "600", "--json");
    expect(ok.status).toBe(0);
    expect((JSON.parse(ok.stdout) as { values: Array<{ k: number }> }).values[0]!.k).toBeCloseTo(1e-4, 15);
    const bad = lightfold("materials", "--csv", join(dir, "bad.csv"));
    expect(bad.status).toBe(2);
    expect(bad.stderr).toContain("bad.csv:3");
  });
});
