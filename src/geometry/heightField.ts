/**
 * Triangulates a periodic height grid (nx × ny samples at pitch px, py; sample (i, j) at
 * (i·px, j·py); column nx wraps to column 0) into triangle vertices over [0, nx·px] × [0, ny·py].
 * Each grid cell becomes two triangles. With `centreHeight` (the true surface at the cell centre,
 * cell (i, j)) the split is along the diagonal whose interpolation matches it better, which makes
 * creases on cell diagonals exact; without it, along the diagonal with the smaller height
 * difference.
 */
export function heightGridVerts(
  heightsUm: ArrayLike<number>,
  nx: number,
  ny: number,
  pxUm: number,
  pyUm: number,
  centreHeight?: (i: number, j: number) => number,
): Float64Array {
  const out = new Float64Array(nx * ny * 18);
  let o = 0;
  const h = (i: number, j: number): number => heightsUm[(j % ny) * nx + (i % nx)];
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      const x0 = i * pxUm, x1 = (i + 1) * pxUm, y0 = j * pyUm, y1 = (j + 1) * pyUm;
      const h00 = h(i, j), h10 = h(i + 1, j), h01 = h(i, j + 1), h11 = h(i + 1, j + 1);
      const quad = [x0, y0, h00, x1, y0, h10, x1, y1, h11, x0, y1, h01];
      // Triangles (0,1,2)+(0,2,3) split along 00–11; (0,1,3)+(1,2,3) along 10–01.
      let alongMain: boolean;
      if (centreHeight !== undefined) {
        const hc = centreHeight(i, j);
        alongMain = Math.abs((h00 + h11) / 2 - hc) <= Math.abs((h10 + h01) / 2 - hc);
      } else {
        alongMain = Math.abs(h00 - h11) <= Math.abs(h10 - h01);
      }
      const order = alongMain ? [0, 1, 2, 0, 2, 3] : [0, 1, 3, 1, 2, 3];
      for (const v of order) {
        out[o++] = quad[3 * v];
        out[o++] = quad[3 * v + 1];
        out[o++] = quad[3 * v + 2];
      }
    }
  }
  return out;
}
