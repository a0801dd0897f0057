/**
 * A plot frame for the report's inline SVG: axes with ticks and labels, lines, bars and a legend.
 * Pure string building; every number written with a fixed number of decimals (same bytes each run).
 */
import { escapeHtml } from './html-escape.js';
import { formatTick, linearScale, linearTicks, logScale, logTicks, type Scale } from './svg-scale.js';

/** One axis: label, log or linear, data range. */
export interface AxisSpec {
  label: string;
  log: boolean;
  min: number;
  max: number;
}

/** A frame: the two scales and the plotting rectangle, pixels. */
export interface Frame {
  x: Scale;
  y: Scale;
  left: number;
  right: number;
  top: number;
  bottom: number;
  width: number;
  height: number;
}

/** Plain colours of our own for data, models and limits. */
export const COLOURS = {
  data: '#1f4e79',
  limit: '#c0392b',
  models: ['#b5651d', '#2e8b57', '#7b3fa0', '#6b6b6b'],
  axis: '#333333',
  grid: '#e3e3e3',
  states: { 'bound-unstable': '#c0392b', unstable: '#e08e0b', stable: '#5d7a99' } as Record<string, string>,
};

/** Fixed-decimal pixel coordinate. */
export function px(v: number): string {
  return v.toFixed(1);
}

/** Builds the frame (scales and rectangle) for a plot of the given size in pixels. */
export function makeFrame(x: AxisSpec, y: AxisSpec, width = 540, height = 340): Frame {
  const left = 70;
  const right = width - 16;
  const top = 30;
  const bottom = height - 48;
  const xs = x.log ? logScale(x.min, x.max, left, right) : linearScale(x.min, x.max, left, right);
  const ys = y.log ? logScale(y.min, y.max, bottom, top) : linearScale(y.min, y.max, bottom, top);
  return { x: xs, y: ys, left, right, top, bottom, width, height };
}

/** Axes, grid lines, tick labels, axis labels and title, as SVG elements. */
export function axes(f: Frame, xLabel: string, yLabel: string, title: string, xTicks = true): string {
  const out: string[] = [];
  const xt = !xTicks ? [] : f.x.log ? logTicks(f.x.d0, f.x.d1) : linearTicks(f.x.d0, f.x.d1, 6);
  const yt = f.y.log ? logTicks(f.y.d0, f.y.d1) : linearTicks(f.y.d0, f.y.d1, 5);
  for (const t of xt) {
    const X = px(f.x(t));
    out.push(`<line x1="${X}" y1="${px(f.top)}" x2="${X}" y2="${px(f.bottom)}" stroke="${COLOURS.grid}"/>`);
    out.push(`<text x="${X}" y="${px(f.bottom + 16)}" text-anchor="middle">${escapeHtml(formatTick(t))}</text>`);
  }
  for (const t of yt) {
    const Y = px(f.y(t));
    out.push(`<line x1="${px(f.left)}" y1="${Y}" x2="${px(f.right)}" y2="${Y}" stroke="${COLOURS.grid}"/>`);
    out.push(`<text x="${px(f.left - 6)}" y="${px(f.y(t) + 4)}" text-anchor="end">${escapeHtml(formatTick(t))}</text>`);
  }
  out.push(
    `<rect x="${px(f.left)}" y="${px(f.top)}" width="${px(f.right - f.left)}" height="${px(f.bottom - f.top)}" fill="none" stroke="${COLOURS.axis}"/>`,
  );
  out.push(`<text x="${px((f.left + f.right) / 2)}" y="${px(f.height - 10)}" text-anchor="middle">${escapeHtml(xLabel)}</text>`);
  const cy = (f.top + f.bottom) / 2;
  out.push(`<text x="16" y="${px(cy)}" text-anchor="middle" transform="rotate(-90 16 ${px(cy)})">${escapeHtml(yLabel)}</text>`);
  out.push(`<text x="${px(f.left)}" y="18" font-weight="bold">${escapeHtml(title)}</text>`);
  return out.join('');
}

/** A polyline through the points inside the frame's domain (non-finite or non-positive-on-log points split it). */
export function line(f: Frame, xs: readonly number[], ys: readonly number[], stroke: string, dash = '', width = 1.6): string {
  const parts: string[] = [];
  let cur: string[] = [];
  const flush = () => {
    if (cur.length >= 2) {
      parts.push(
        `<polyline fill="none" stroke="${stroke}" stroke-width="${width}"${dash ? ` stroke-dasharray="${dash}"` : ''} points="${cur.join(' ')}"/>`,
      );
    }
    cur = [];
  };
  for (let i = 0; i < Math.min(xs.length, ys.length); i++) {
    const X = f.x(xs[i]);
    const Y = f.y(ys[i]);
    const inside = Number.isFinite(X) && Number.isFinite(Y) && Y >= f.top - 0.5 && Y <= f.bottom + 0.5 && X >= f.left - 0.5 && X <= f.right + 0.5;
    if (inside) cur.push(`${px(X)},${px(Y)}`);
    else flush();
  }
  flush();
  return parts.join('');
}

/** A vertical line at data x across the frame, with a label at its top. */
export function vline(f: Frame, x: number, stroke: string, label: string): string {
  const X = f.x(x);
  if (!Number.isFinite(X) || X < f.left || X > f.right) return '';
  return (
    `<line x1="${px(X)}" y1="${px(f.top)}" x2="${px(X)}" y2="${px(f.bottom)}" stroke="${stroke}" stroke-width="1.6" stroke-dasharray="5 3"/>` +
    `<text x="${px(X + 4)}" y="${px(f.top + 12)}" fill="${stroke}">${escapeHtml(label)}</text>`
  );
}

/** Bars between edges[i] and edges[i+1] with heights values[i] (zero or off-scale bars skipped). */
export function bars(f: Frame, edges: readonly number[], values: readonly number[], fill: string): string {
  const out: string[] = [];
  const base = f.y.log ? f.bottom : Math.min(f.bottom, Math.max(f.top, f.y(0)));
  for (let i = 0; i < values.length && i + 1 < edges.length; i++) {
    const Y = f.y(values[i]);
    if (!Number.isFinite(Y) || values[i] <= 0) continue;
    const x0 = Math.max(f.left, f.x(edges[i]));
    const x1 = Math.min(f.right, f.x(edges[i + 1]));
    if (!(x1 > x0)) continue;
    const top = Math.max(f.top, Y);
    out.push(`<rect x="${px(x0)}" y="${px(top)}" width="${px(x1 - x0)}" height="${px(Math.max(0, base - top))}" fill="${fill}" fill-opacity="0.55" stroke="${fill}" stroke-width="0.6"/>`);
  }
  return out.join('');
}

/** One legend entry: a sample line (or ring) and its label. */
export interface LegendEntry {
  label: string;
  colour: string;
  dash?: string;
  ring?: boolean;
}

/** A legend below the axes, entries laid out left to right and wrapped; returns the SVG and the height it adds. */
export function legend(f: Frame, entries: readonly LegendEntry[]): { svg: string; height: number } {
  if (entries.length === 0) return { svg: '', height: 0 };
  const out: string[] = [];
  let x = f.left;
  let row = 0;
  for (const e of entries) {
    const w = 36 + 6.2 * e.label.length + 14;
    if (x + w > f.width - 8 && x > f.left) {
      x = f.left;
      row++;
    }
    const y = f.height + 4 + 16 * row;
    if (e.ring) out.push(`<circle cx="${px(x + 12)}" cy="${px(y - 4)}" r="4" fill="#ffffff" stroke="${e.colour}" stroke-width="2"/>`);
    else out.push(`<line x1="${px(x)}" y1="${px(y - 4)}" x2="${px(x + 24)}" y2="${px(y - 4)}" stroke="${e.colour}" stroke-width="2"${e.dash ? ` stroke-dasharray="${e.dash}"` : ''}/>`);
    out.push(`<text x="${px(x + 30)}" y="${px(y)}">${escapeHtml(e.label)}</text>`);
    x += w;
  }
  return { svg: out.join(''), height: 16 * (row + 1) + 6 };
}

/** Wraps plot content in one <svg> element with an accessible title; `extra` pixels are added below the frame (legend). */
export function svgElement(f: Frame, id: string, title: string, content: string, extra = 0): string {
  const h = f.height + extra;
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" id="${escapeHtml(id)}" class="plot" width="${f.width}" height="${h}" viewBox="0 0 ${f.width} ${h}" role="img" aria-label="${escapeHtml(title)}">` +
    `<title>${escapeHtml(title)}</title>${content}</svg>`
  );
}

/** An SVG placeholder saying why a plot is missing (still one <svg> per plot). */
export function emptyPlot(id: string, title: string, why: string, width = 540, height = 120): string {
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" id="${escapeHtml(id)}" class="plot" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="${escapeHtml(title)}">` +
    `<title>${escapeHtml(title)}</title><text x="16" y="24" font-weight="bold">${escapeHtml(title)}</text>` +
    `<text x="16" y="56">${escapeHtml(why)}</text></svg>`
  );
}
