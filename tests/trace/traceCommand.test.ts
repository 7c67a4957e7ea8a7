import { afterEach, describe, expect, it, vi } from "vitest";
import { main } from "../../src/cli/main.js";

const STUDY = "configs/bench-pyramids.study.json";

function capture(): { out: () => string; err: () => string } {
  let out = "";
  let err = "";
  vi.spyOn(process.stdout, "write").mockImplementation((chunk: string | Uint8Array) => ((out += String(chunk)), true));
  vi.spyOn(process.stderr, "write").mockImplementation((chunk: string | Uint8Array) => ((err += String(chunk)), true));
  return { out: () => out, err: () => err };
}

afterEach(() => {
  vi.restoreAllMocks();
  process.exitCode = undefined;
});

describe("lightfold trace", () => {
  it("prints every channel with its standard error; --json gives the same numbers for the same seed", async () => {
    const io = capture();
    const args = ["trace", STUDY, "--angle", "30", "--wavelength", "1000", "--rays", "400", "--seed", "3"];
    expect(await main(["node", "lightfold", ...args, "--json"])).toBe(0);
    const json = JSON.parse(io.out());
    const names = Object.keys(json.channels);
    expect(names).toEqual(["R_first", "R_escape", "A_absorber", "A_rear", "T_first", "T_escape", "unresolved"]);
    expect(json.channelSum).toBeCloseTo(1, 12);
    expect(json.nRays).toBe(400);
    vi.restoreAllMocks();
    const io2 = capture();
    expect(await main(["node", "lightfold", ...args])).toBe(0);
    const line = io2.out().split("\n").find((l) => l.trim().startsWith("A_absorber"))!;
    expect(line).toContain(json.channels.A_absorber.mean.toFixed(6));
    expect(line).toContain(json.channels.A_absorber.stderr.toFixed(6));
  });

  it("launch sampling by the sweep's rule: Sobol' when --rays fills 16 of the study's batches (1000 rays each here), unless named", async () => {
    const samplingOf = async (...extra: string[]): Promise<string> => {
      const io = capture();
      expect(await main(["node", "lightfold", "trace", STUDY, "--wavelength", "1000", "--seed", "3", "--json", ...extra])).toBe(0);
      const json = JSON.parse(io.out());
      vi.restoreAllMocks();
      return json.sampling;
    };
    expect(await samplingOf("--rays", "16000")).toBe("sobol");
    expect(await samplingOf("--rays", "15000")).toBe("random");
    expect(await samplingOf("--rays", "16000", "--sampling", "random")).toBe("random");
    expect(await samplingOf("--rays", "64", "--sampling", "sobol")).toBe("sobol");
  });

  it("bad flags exit with code 2 and name the flag", async () => {
    const io = capture();
    expect(await main(["node", "lightfold", "trace", STUDY, "--rays", "0"])).toBe(2);
    expect(io.err()).toContain("--rays");
    expect(await main(["node", "lightfold", "trace", STUDY, "--angle", "95"])).toBe(2);
    expect(io.err()).toContain("--angle");
    expect(await main(["node", "lightfold", "trace", STUDY, "--wavelength", "3000", "--rays", "10"])).toBe(2);
    expect(io.err()).toContain("stack.absorber.material");
  });
});
