/**
 * Slice view of the Jeans number J = dx / lambda_J on a 2D canvas, with the 1/N_J limit marked
 * (Truelove et al. 1997: J <= 1/4). Cells at or below the limit use a grey-blue ramp, cells above it
 * an orange-red ramp, and the boundary of the over-limit region is outlined. Fields are C order
 * (i*n + j)*n + k, i along x; a slice fixes one axis.
 */

export type SliceAxis = 'x' | 'y' | 'z';

/** Index of cell (a, b) of slice `s` across `axis`: the two remaining axes in x, y, z order (a horizontal, b vertical). */
export function sliceIndex(axis: SliceAxis, s: number, a: number, b: number, n: number): number {
  if (axis === 'z') return (a * n + b) * n + s; // a = i (x), b = j (y)
  if (axis === 'y') return (a * n + s) * n + b; // a = i (x), b = k (z)
  return (s * n + a) * n + b; // a = j (y), b = k (z)
}

/** Number of cells above `limit` in slice `s`. */
export function countAbove(jeans: Float32Array, n: number, axis: SliceAxis, s: number, limit: number): number {
  let c = 0;
  for (let a = 0; a < n; a++) for (let b = 0; b < n; b++) if (jeans[sliceIndex(axis, s, a, b, n)] > limit) c++;
  return c;
}

/** RGB (0..255) of log10 J at fraction t in [0, 1] of the colour range; `above` picks the over-limit ramp. */
export function jeansColour(t: number, above: boolean): [number, number, number] {
  const u = Math.min(1, Math.max(0, t));
  if (above) return [Math.round(235 + 20 * u), Math.round(150 - 120 * u), Math.round(40 - 20 * u)];
  return [Math.round(25 + 150 * u), Math.round(35 + 150 * u), Math.round(70 + 150 * u)];
}

/** Log10 range shown: the data range widened to include the limit. */
export function jeansLogRange(jeans: Float32Array, limit: number): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (let c = 0; c < jeans.length; c++) {
    const v = jeans[c];
    if (v > 0) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  const ll = Math.log10(limit);
  if (!(lo <= hi)) return [ll - 1, ll + 1];
  const a = Math.min(Math.log10(lo), ll - 0.1);
  const b = Math.max(Math.log10(hi), ll + 0.1);
  return [a, b];
}

/** Draws slice `s` of the Jeans number into `canvas` (image plus colour bar with the limit line). */
export function drawJeansSlice(canvas: HTMLCanvasElement, jeans: Float32Array, n: number, axis: SliceAxis, s: number, limit: number, range: [number, number]): void {
  const ctx = canvas.getContext('2d');
  if (!ctx) return;
  const W = canvas.width;
  const H = canvas.height;
  const bar = 44;
  const size = Math.min(W - 8, H - bar - 8);
  const cell = size / n;
  const x0 = (W - size) / 2;
  const y0 = 4;
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, W, H);
  const img = ctx.createImageData(n, n);
  const span = range[1] - range[0] || 1;
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      const v = jeans[sliceIndex(axis, s, a, b, n)];
      const t = v > 0 ? (Math.log10(v) - range[0]) / span : 0;
      const [r, g, bl] = jeansColour(t, v > limit);
      const p = ((n - 1 - b) * n + a) * 4; // b upward
      img.data[p] = r;
      img.data[p + 1] = g;
      img.data[p + 2] = bl;
      img.data[p + 3] = 255;
    }
  }
  const off = document.createElement('canvas');
  off.width = n;
  off.height = n;
  (off.getContext('2d') as CanvasRenderingContext2D).putImageData(img, 0, 0);
  ctx.imageSmoothingEnabled = false;
  ctx.drawImage(off, x0, y0, size, size);
  // outline of the over-limit region: edges between a cell above and one not above
  ctx.strokeStyle = '#ffffff';
  ctx.lineWidth = 1.5;
  ctx.beginPath();
  const above = (a: number, b: number) => a >= 0 && b >= 0 && a < n && b < n && jeans[sliceIndex(axis, s, a, b, n)] > limit;
  for (let a = 0; a < n; a++) {
    for (let b = 0; b < n; b++) {
      if (!above(a, b)) continue;
      const X = x0 + a * cell;
      const Y = y0 + (n - 1 - b) * cell;
      if (!above(a - 1, b)) (ctx.moveTo(X, Y), ctx.lineTo(X, Y + cell));
      if (!above(a + 1, b)) (ctx.moveTo(X + cell, Y), ctx.lineTo(X + cell, Y + cell));
      if (!above(a, b + 1)) (ctx.moveTo(X, Y), ctx.lineTo(X + cell, Y));
      if (!above(a, b - 1)) (ctx.moveTo(X, Y + cell), ctx.lineTo(X + cell, Y + cell));
    }
  }
  ctx.stroke();
  // colour bar with the limit line
  const by = y0 + size + 8;
  const bw = size;
  const ll = Math.log10(limit);
  for (let x = 0; x < bw; x++) {
    const lv = range[0] + (span * x) / bw;
    const [r, g, b] = jeansColour(x / bw, lv > ll);
    ctx.fillStyle = `rgb(${r},${g},${b})`;
    ctx.fillRect(x0 + x, by, 1, 12);
  }
  const lx = x0 + ((ll - range[0]) / span) * bw;
  ctx.strokeStyle = '#000000';
  ctx.lineWidth = 2;
  ctx.beginPath();
  ctx.moveTo(lx, by - 3);
  ctx.lineTo(lx, by + 15);
  ctx.stroke();
  ctx.fillStyle = '#222222';
  ctx.font = '11px sans-serif';
  ctx.textAlign = 'left';
  ctx.fillText(`log10 J ${range[0].toFixed(1)}`, x0, by + 26);
  ctx.textAlign = 'right';
  ctx.fillText(range[1].toFixed(1), x0 + bw, by + 26);
  ctx.textAlign = 'center';
  ctx.fillText(`limit J = ${Number(limit.toPrecision(3))}`, Math.min(Math.max(lx, x0 + 50), x0 + bw - 50), by + 38);
}
