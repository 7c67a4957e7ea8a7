import { describe, expect, it } from "vitest";
import { encodeNpyFloat64, npyHeader, pythonShape } from "../../src/export/npy.js";
import { readNpy } from "./npyReader.js";

// Format facts checked here are from NumPy NEP 1 ("A Simple File Format for NumPy Arrays") and the
// numpy.lib.format module documentation: magic "\x93NUMPY", version 1.0 = bytes 0x01 0x00, a
// little-endian uint16 HEADER_LEN, an ASCII dict with keys descr / fortran_order / shape, padded
// with spaces and terminated by "\n" so that the total header is divisible by 64 (current NumPy
// alignment; NEP 1 originally said 16, and 64 is also a multiple of 16).
describe("encodeNpyFloat64(shape, data)", () => {
  it("writes magic, version 1.0 and a header length that puts the data at a multiple of 64", () => {
    for (const shape of [[0], [1], [5], [2, 3], [3, 2, 4, 5], [123456, 1, 1, 1]]) {
      const n = shape.reduce((a, b) => a * b, 1);
      const bytes = encodeNpyFloat64(shape, new Float64Array(n));
      expect(Array.from(bytes.subarray(0, 6))).toEqual([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]);
      expect(bytes[6]).toBe(1);
      expect(bytes[7]).toBe(0);
      const headerLen = bytes[8] + 256 * bytes[9];
      expect((10 + headerLen) % 64).toBe(0);
      expect(bytes[10 + headerLen - 1]).toBe(0x0a); // "\n" ends the header
      expect(bytes.length).toBe(10 + headerLen + 8 * n);
    }
  });

  it("header is the Python dict literal with a tuple shape (1-tuples keep the comma)", () => {
    expect(pythonShape([5])).toBe("(5,)");
    expect(pythonShape([2, 3])).toBe("(2, 3)");
    expect(npyHeader([2, 3]).trimEnd()).toBe("{'descr': '<f8', 'fortran_order': False, 'shape': (2, 3), }");
  });

  it("round-trips through an independent reader bit for bit, in C order", () => {
    const data = Float64Array.from([Math.PI, -0, 1e-310, Number.MAX_VALUE, 0.1 + 0.2, -1 / 3]);
    const back = readNpy(encodeNpyFloat64([2, 3], data));
    expect(back.descr).toBe("<f8");
    expect(back.fortranOrder).toBe(false);
    expect(back.shape).toEqual([2, 3]);
    expect(new Uint8Array(back.data.buffer)).toEqual(new Uint8Array(data.buffer)); // same bits (incl. -0)
  });

  it("writes little-endian bytes: 1.0 is 00 00 00 00 00 00 f0 3f (IEEE 754 binary64)", () => {
    const bytes = encodeNpyFloat64([1], [1]);
    expect(Array.from(bytes.subarray(bytes.length - 8))).toEqual([0, 0, 0, 0, 0, 0, 0xf0, 0x3f]);
  });

  it("rejects a shape that does not match the data length", () => {
    expect(() => encodeNpyFloat64([2, 2], new Float64Array(3))).toThrow(/holds 4 values, data has 3/);
    expect(() => encodeNpyFloat64([-1], new Float64Array(0))).toThrow(/invalid dimension/);
  });
});
