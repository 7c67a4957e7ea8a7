import { describe, expect, it } from "vitest";
import { RandomStream } from "../../src/random/stream.js";
import { parseJsonInput } from "../../src/util/inputFile.js";
import { lineColumn, scanJson } from "../../src/util/jsonScan.js";
import { inputErrorOf } from "../helpers/inputError.js";

/** A random JSON value (nested objects and arrays, numbers of every form, escaped strings). */
function randomValue(rng: RandomStream, depth: number): unknown {
  const r = rng.next();
  if (depth > 3 || r < 0.4) {
    const k = Math.floor(rng.next() * 6);
    return [() => rng.next() * 1e6 - 5e5, () => -1.5e-300 * rng.next(), () => Math.floor(rng.next() * 100), () => "a\"b\\c\n\u00e9\u0001", () => null, () => rng.next() < 0.5][k]!();
  }
  if (r < 0.7) return Array.from({ length: Math.floor(rng.next() * 4) }, () => randomValue(rng, depth + 1));
  const o: Record<string, unknown> = {};
  for (let i = 0; i < Math.floor(rng.next() * 4); i++) o[`k${i}\u00fc"`] = randomValue(rng, depth + 1);
  return o;
}

describe("scanJson(text): syntax as JSON.parse (ECMA-404 / RFC 8259) reads it, plus repeated keys", () => {
  it("accepts what JSON.parse accepts and refuses what it refuses, over random documents and one-character edits", () => {
    // JSON.parse (the ECMAScript implementation of RFC 8259) is the reference.
    const rng = new RandomStream("tests/jsonScan");
    const alphabet = ['"', "{", "}", "[", "]", ",", ":", "1", "-", ".", "e", " ", "\\", "n", "x"];
    let refused = 0;
    for (let doc = 0; doc < 300; doc++) {
      const text = JSON.stringify(randomValue(rng, 0), null, doc % 2 === 0 ? 2 : undefined);
      expect(scanJson(text)).toBeUndefined();
      for (let edit = 0; edit < 5; edit++) {
        const at = Math.floor(rng.next() * (text.length + 1));
        const c = alphabet[Math.floor(rng.next() * alphabet.length)]!;
        const mutated = rng.next() < 0.5 ? text.slice(0, at) + c + text.slice(at) : text.slice(0, at) + text.slice(at + 1);
        let parses = true;
        try {
          JSON.parse(mutated);
        } catch {
          parses = false;
        }
        const p = scanJson(mutated);
        // A mutation may create a repeated key, which JSON.parse accepts silently and the scan reports
        // (possibly before a later syntax error): that is the one difference.
        if (parses) expect(p?.kind, mutated).not.toBe("syntax");
        else expect(p, mutated).toBeDefined();
        if (!parses) refused++;
      }
    }
    expect(refused).toBeGreaterThan(500);
  });

  it("names the repeated key, its object path, line and column", () => {
    const text = '{\n  "a": {\n    "b": [1, {"c": 1, "c": 2}]\n  }\n}';
    const p = scanJson(text);
    expect(p).toEqual({ kind: "duplicate", offset: text.indexOf('"c": 2'), key: "c", path: "a.b[1]" });
    expect(lineColumn(text, p!.offset)).toEqual({ line: 3, column: 23 });
    expect(inputErrorOf(() => parseJsonInput(text, "d.json"))).toBe('d.json: line 3, column 23: key "c" appears twice in a.b[1]; expected each key once');
  });

  it("reads a file that starts with a byte-order mark, and positions errors Node 20 reports without one", () => {
    expect(parseJsonInput('\uFEFF{"a": 1}', "bom.json")).toEqual({ a: 1 });
    expect(inputErrorOf(() => parseJsonInput('{"a": 1,\n "b": }', "x.json"))).toMatch(/^x\.json: not valid JSON: line 2, column 7 /);
    expect(inputErrorOf(() => parseJsonInput('{"a": [1, 2', "x.json"))).toMatch(/^x\.json: not valid JSON: line 1, column 12 \(unexpected end of the text/);
  });

  it("walks deep nesting without recursion", () => {
    expect(scanJson("[".repeat(100_000) + "]".repeat(100_000))).toBeUndefined();
    expect(scanJson("[".repeat(100_000))?.kind).toBe("syntax");
  });
});
