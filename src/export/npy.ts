/**
 * NumPy `.npy` encoding, format version 1.0, for little-endian float64 arrays in C order.
 * Layout (NumPy NEP 1 and the `numpy.lib.format` documentation): the 6-byte magic "\x93NUMPY", the
 * version bytes 1 and 0, a little-endian uint16 header length, then an ASCII Python dict literal
 * `{'descr': '<f8', 'fortran_order': False, 'shape': (...), }` padded with spaces and ended by "\n"
 * so that the data starts at a multiple of 64 bytes, then the raw array bytes.
 */
export const NPY_MAGIC = Uint8Array.from([0x93, 0x4e, 0x55, 0x4d, 0x50, 0x59]); // \x93NUMPY
export const NPY_ALIGN = 64;
const PREAMBLE_BYTES = 10; // magic (6) + version (2) + header length (2)

/** Python tuple literal of a shape: (), (5,), (2, 3). */
export function pythonShape(shape: readonly number[]): string {
  if (shape.length === 1) return `(${shape[0]},)`;
  return `(${shape.join(", ")})`;
}

/** The padded header dict (including the final newline) for a '<f8' C-order array. */
export function npyHeader(shape: readonly number[]): string {
  const dict = `{'descr': '<f8', 'fortran_order': False, 'shape': ${pythonShape(shape)}, }`;
  const unpadded = PREAMBLE_BYTES + dict.length + 1;
  const total = Math.ceil(unpadded / NPY_ALIGN) * NPY_ALIGN;
  return dict + " ".repeat(total - unpadded) + "\n";
}

/** Encodes `data` (length = product of `shape`) as a complete .npy file. */
export function encodeNpyFloat64(shape: readonly number[], data: ArrayLike<number>): Uint8Array {
  for (const d of shape) {
    if (!Number.isInteger(d) || d < 0) throw new RangeError(`npy: invalid dimension ${d} in shape ${pythonShape(shape)}`);
  }
  const count = shape.reduce((a, b) => a * b, 1);
  if (count !== data.length) {
    throw new RangeError(`npy: shape ${pythonShape(shape)} holds ${count} values, data has ${data.length}`);
  }
  const header = npyHeader(shape);
  if (header.length > 0xffff) throw new RangeError("npy: header too long for format version 1.0");
  const offset = PREAMBLE_BYTES + header.length;
  const bytes = new Uint8Array(offset + 8 * count);
  bytes.set(NPY_MAGIC, 0);
  bytes[6] = 1; // major version
  bytes[7] = 0; // minor version
  const view = new DataView(bytes.buffer);
  view.setUint16(8, header.length, true);
  for (let i = 0; i < header.length; i++) bytes[PREAMBLE_BYTES + i] = header.charCodeAt(i);
  // Data block: explicit little-endian writes, so the file is the same on any host byte order.
  for (let i = 0; i < count; i++) view.setFloat64(offset + 8 * i, data[i], true);
  return bytes;
}
