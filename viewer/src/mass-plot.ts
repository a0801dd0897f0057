/**
 * The candidate mass spectrum in the viewer: an SVG (string) with log axes, the candidates as a
 * dN/dlog10 M histogram (0.25 dex bins) and a tick per candidate, the model curves of plots.json
 * and the fitted power law dN/dM ~ M^-slope above x_min (Clauset, Shalizi & Newman 2009 fit, from the run).
 */
import type { MassSpectrumPlot } from '../../src/report/plot-data.js';

const MODEL_COLOURS = ['#2b7a4b', '#7a4bb0', '#a0522d', '#555555'];

function esc(t: string): string {
  return t.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** SVG markup of the mass spectrum, `w` x `h` pixels. */
export function massSpectrumSvg(p: MassSpectrumPlot | null, w = 380, h = 230): string {
  const nLegend = (p?.models.length ?? 0) + (p?.fit ? 1 : 0);
  const H = h + 13 * nLegend + 4;
  const head = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${H}" viewBox="0 0 ${w} ${H}" class="mass-plot">`;
  const masses = (p?.masses_msun ?? []).filter((m) => m > 0 && Number.isFinite(m));
  if (!p || masses.length === 0) return `${head}<text x="10" y="24">No fragment candidates.</text></svg>`;
  const lm = masses.map(Math.log10);
  const e0 = Math.floor(Math.min(...lm) * 4) / 4;
  const e1 = Math.max(e0 + 0.25, Math.ceil(Math.max(...lm) * 4) / 4);
  const nb = Math.round((e1 - e0) / 0.25);
  const counts = new Array<number>(nb).fill(0);
  for (const v of lm) counts[Math.min(nb - 1, Math.max(0, Math.floor((v - e0) / 0.25)))] += 1;
  const dn = counts.map((c) => c / 0.25);
  const xa = e0 - 0.5;
  const xb = e1 + 0.5;
  const ys = [...dn.filter((v) => v > 0)];
  for (const m of p.models) m.dn_dlogm.forEach((v, i) => { const lx = Math.log10(m.masses_msun[i]); if (v > 0 && lx >= xa && lx <= xb) ys.push(v); });
  const ya = Math.floor(Math.log10(Math.min(...ys))) - 0.2;
  const yb = Math.ceil(Math.log10(Math.max(...ys))) + 0.2;
  const L = 46, R = w - 8, T = 10, B = h - 34;
  const X = (lx: number) => L + ((lx - xa) / (xb - xa)) * (R - L);
  const Y = (ly: number) => B - ((ly - ya) / (yb - ya)) * (B - T);
  const out: string[] = [head, `<rect x="${L}" y="${T}" width="${R - L}" height="${B - T}" fill="#ffffff" stroke="#444"/>`];
  for (let e = Math.ceil(xa); e <= Math.floor(xb); e++) out.push(`<line x1="${X(e).toFixed(1)}" y1="${B}" x2="${X(e).toFixed(1)}" y2="${B + 4}" stroke="#444"/><text x="${X(e).toFixed(1)}" y="${B + 15}" text-anchor="middle">1e${e}</text>`);
  for (let e = Math.ceil(ya); e <= Math.floor(yb); e++) out.push(`<line x1="${L - 4}" y1="${Y(e).toFixed(1)}" x2="${L}" y2="${Y(e).toFixed(1)}" stroke="#444"/><text x="${L - 6}" y="${(Y(e) + 4).toFixed(1)}" text-anchor="end">1e${e}</text>`);
  out.push(`<text x="${(L + R) / 2}" y="${h - 4}" text-anchor="middle">candidate mass (Msun)</text>`);
  out.push(`<text x="10" y="${(T + B) / 2}" text-anchor="middle" transform="rotate(-90 10 ${(T + B) / 2})">dN/dlog10 M</text>`);
  dn.forEach((v, i) => {
    if (v <= 0) return;
    const x0 = X(e0 + 0.25 * i);
    const x1 = X(e0 + 0.25 * (i + 1));
    const y = Math.max(T, Y(Math.log10(v)));
    out.push(`<rect x="${x0.toFixed(1)}" y="${y.toFixed(1)}" width="${(x1 - x0).toFixed(1)}" height="${(B - y).toFixed(1)}" fill="#3d6fa3" fill-opacity="0.55" stroke="#3d6fa3"/>`);
  });
  for (const v of lm) out.push(`<line x1="${X(v).toFixed(1)}" y1="${B}" x2="${X(v).toFixed(1)}" y2="${B - 6}" stroke="#1d3d5e"/>`);
  const legend: string[] = [];
  p.models.forEach((m, i) => {
    const c = MODEL_COLOURS[i % MODEL_COLOURS.length];
    const pts = m.masses_msun.map((mm, j) => [Math.log10(mm), m.dn_dlogm[j] > 0 ? Math.log10(m.dn_dlogm[j]) : NaN]).filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b) && a >= xa && a <= xb && b >= ya && b <= yb);
    if (pts.length > 1) out.push(`<polyline fill="none" stroke="${c}" stroke-width="1.6" stroke-dasharray="4 3" points="${pts.map(([a, b]) => `${X(a).toFixed(1)},${Y(b).toFixed(1)}`).join(' ')}"/>`);
    legend.push(`<tspan fill="${c}">&#8212; ${esc(m.name)}</tspan>`);
  });
  if (p.fit && p.fit.slope > 1 && p.fit.n_tail > 0) {
    const { slope, xmin_msun: xmin, n_tail: n } = p.fit;
    const f = (m: number) => Math.LN10 * n * (slope - 1) * xmin ** (slope - 1) * m ** (1 - slope);
    const hi = Math.max(...masses);
    out.push(`<line x1="${X(Math.log10(xmin)).toFixed(1)}" y1="${Y(Math.log10(f(xmin))).toFixed(1)}" x2="${X(Math.log10(hi)).toFixed(1)}" y2="${Y(Math.log10(f(hi))).toFixed(1)}" stroke="#c0392b" stroke-width="2"/>`);
    legend.push(`<tspan fill="#c0392b">&#8212; fit slope ${slope.toPrecision(3)}</tspan>`);
  }
  legend.forEach((l, i) => out.push(`<text x="${L}" y="${h + 10 + 13 * i}">${l}</text>`));
  out.push('</svg>');
  return out.join('');
}
