/**
 * A tiny independent reader for .npy version 1.0/2.0 files of '<f8' arrays, written from the format
 * description in NumPy NEP 1 and the numpy.lib.format documentation (magic "\x93NUMPY", version
 * bytes, little-endian header length, Python-dict header, raw data).
 */
export interface NpyArray {
  major: number;
  minor: number;
  headerText: string;
  dataOffset: number;
  descr: string;
  fortranOrder: boolean;
  shape: number[];
  data: Float64Array;
}

export function readNpy(bytes: Uint8Array): NpyArray {
  const magic = [0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59];
  magic.forEach((b, i) => {
    if (bytes[i] !== b) throw new Error(`bad magic byte ${i}`);
  });
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const major = bytes[6];
  const minor = bytes[7];
  const headerLen = major === 1 ? view.getUint16(8, true) : view.getUint32(8, true);
  const start = major === 1 ? 10 : 12;
  const headerText = Buffer.from(bytes.subarray(start, start + headerLen)).toString("latin1");
  const descr = /'descr':\s*'([^']*)'/.exec(headerText)?.[1] ?? "";
  const fortranOrder = /'fortran_order':\s*True/.test(headerText);
  const shapeText = /'shape':\s*\(([^)]*)\)/.exec(headerText)?.[1] ?? "";
  const shape = shapeText
    .split(",")
    .map((s) => s.trim())
    .filter((s) => s !== "")
    .map(Number);
  if (descr !== "<f8") throw new Error(`unsupported dtype ${descr}`);
  const dataOffset = start + headerLen;
  const count = shape.reduce((a, b) => a * b, 1);
  const data = new Float64Array(count);
  for (let i = 0; i < count; i++) data[i] = view.getFloat64(dataOffset + 8 * i, true);
  if (dataOffset + 8 * count !== bytes.byteLength) throw new Error("trailing or missing data bytes");
  return { major, minor, headerText, dataOffset, descr, fortranOrder, shape, data };
}
