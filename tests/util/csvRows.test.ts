import { describe, expect, it } from "vitest";
import { parseNkCsv } from "../../src/materials/index.js";
import { parseHeightMapCsv } from "../../src/geometry/heightMapCsv.js";
import { parseWeatherCsv } from "../../src/weather/weatherCsv.js";
import { detectDelimiter, readCsvRows } from "../../src/util/csvRows.js";
import { inputErrorOf } from "../helpers/inputError.js";

describe("readCsvRows(text, label)", () => {
  it("reads RFC 4180 quoted cells: a separator and a doubled quote inside quotes (RFC 4180 §2, rules 6–7)", () => {
    const rows = readCsvRows('"Wavelength, nm",n,"say ""k"""\n300,1,2\n', "q.csv");
    expect(rows).toEqual([
      { cells: ["Wavelength, nm", "n", 'say "k"'], line: 1 },
      { cells: ["300", "1", "2"], line: 2 },
    ]);
  });

  it("keeps file line numbers past comments, blank and space-only lines, a BOM and CRLF endings", () => {
    const rows = readCsvRows("\uFEFF# comment\r\nwavelength_nm,n\r\n\r\n   \r\n400,1.5\r\n# late comment\r\n500,1.4\r\n", "l.csv");
    expect(rows.map((r) => r.line)).toEqual([2, 5, 7]);
    expect(rows[0]!.cells).toEqual(["wavelength_nm", "n"]);
  });

  it("picks the separator from the first data line, ignoring quoted text", () => {
    expect(detectDelimiter('# a,b\n"x, y";n;k\n')).toBe(";");
    expect(detectDelimiter("a\tb c\n")).toBe("\t");
    expect(detectDelimiter("1 2  3\n")).toBe("whitespace");
    expect(readCsvRows("1  2 3\n 4\t5 6\n", "w.txt").map((r) => r.cells)).toEqual([["1", "2", "3"], ["4", "5", "6"]]);
  });

  it("names file and line of an unclosed or stray quote", () => {
    expect(inputErrorOf(() => readCsvRows('a,b\n1,"2\n3,4\n', "open.csv"))).toMatch(/^open\.csv:3: not readable as CSV/);
    expect(inputErrorOf(() => readCsvRows('a,b\n1,2"x\n', "stray.csv"))).toMatch(/^stray\.csv:2: not readable as CSV/);
  });
});

describe("the CSV inputs read through readCsvRows", () => {
  it('n,k table: a quoted header "Wavelength, nm",n,k (an instrument export) reads as wavelength_nm', () => {
    const t = parseNkCsv('"Wavelength, nm",n,k\n400,2.1,0.01\n500,2.0,0.005\n', "export.csv");
    expect(Array.from(t.wavelengthNm)).toEqual([400, 500]);
    expect(inputErrorOf(() => parseNkCsv('"Wavelength, nm",n,k\n400,2.1\n', "short.csv"))).toContain("short.csv:2: row has 2 fields");
  });

  it("height map: semicolon grid with a quoted cell; ragged rows named by line", () => {
    expect(parseHeightMapCsv('# h\n0;"1"\n2;3\n', "h.csv")).toEqual({ nx: 2, ny: 2, heightsUm: Float64Array.from([0, 1, 2, 3]) });
    expect(inputErrorOf(() => parseHeightMapCsv("0,1\n\n2\n", "r.csv"))).toContain("r.csv: line 3: expected 2 cells (as on line 1), got 1");
  });

  it("weather: quoted header cells and CRLF; bad rows keep their file line numbers", () => {
    const text = '"time","ghi_wm2","dni_wm2","dhi_wm2"\r\n# note\r\n2027-01-01T00:00:00+01:00,0,0,0\r\n2027-01-01T01:00:00+01:00,x,0,0\r\n';
    expect(inputErrorOf(() => parseWeatherCsv(text, "w.csv"))).toContain('line 4: ghi_wm2 "x" is not a number');
    const w = parseWeatherCsv(text.replace(",x,", ",5,"), "w.csv");
    expect(Array.from(w.ghiWm2)).toEqual([0, 5]);
  });
});
