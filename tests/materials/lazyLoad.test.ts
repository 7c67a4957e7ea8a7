import { describe, expect, it, vi } from "vitest";

// Count file reads: the catalogue must read a table only when its material is first used.
const reads: string[] = [];
vi.mock("node:fs", async (importOriginal) => {
  const actual = await importOriginal<typeof import("node:fs")>();
  return {
    ...actual,
    readFileSync: (...args: Parameters<typeof actual.readFileSync>) => {
      reads.push(String(args[0]));
      return actual.readFileSync(...args);
    },
  };
});

const { MaterialRegistry } = await import("../../src/materials/index.js");

describe("MaterialRegistry.withBuiltins() loading", () => {
  it("reads no table until a material is used, then only that table, once", () => {
    const r = MaterialRegistry.withBuiltins();
    const si = r.get("Si");
    expect(reads.filter((p) => p.endsWith(".csv"))).toEqual([]);
    si.nk(600);
    si.nk(700);
    expect(si.maxWavelengthNm).toBe(1450);
    const csvReads = reads.filter((p) => p.endsWith(".csv"));
    expect(csvReads.length).toBe(1);
    expect(csvReads[0]!.endsWith("si_green2008.csv")).toBe(true);
    r.get("SiO2").nk(600); // formula material: no file at all
    expect(reads.filter((p) => p.endsWith(".csv")).length).toBe(1);
  });
});
