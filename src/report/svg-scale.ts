/**
 * Scales and ticks for the report's SVG plots: pure functions, no DOM.
 * A scale maps a data value to a pixel coordinate; log scales take log10 of the value.
 */

/** A linear or log10 mapping of [d0, d1] (data units) onto [r0, r1] (pixels). */
export interface Scale {
  (v: number): number;
  readonly d0: number;
  readonly d1: number;
  readonly log: boolean;
}

/** Linear scale from data [d0, d1] to pixels [r0, r1]; a zero-width domain maps to the middle of the range. */
export function linearScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const span = d1 - d0;
  const f = (v: number) => (span === 0 ? (r0 + r1) / 2 : r0 + ((v - d0) / span) * (r1 - r0));
  return Object.assign(f, { d0, d1, log: false });
}

/** Log10 scale from positive data [d0, d1] to pixels [r0, r1]; values <= 0 map to NaN. */
export function logScale(d0: number, d1: number, r0: number, r1: number): Scale {
  const l0 = Math.log10(d0);
  const l1 = Math.log10(d1);
  const span = l1 - l0;
  const f = (v: number) => {
    if (!(v > 0)) return NaN;
    return span === 0 ? (r0 + r1) / 2 : r0 + ((Math.log10(v) - l0) / span) * (r1 - r0);
  };
  return Object.assign(f, { d0, d1, log: true });
}

/** [min, max] of the finite values (positive only when `positive`), or null when there are none. */
export function extent(values: readonly number[], positive = false): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v) || (positive && v <= 0)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : null;
}

/** Widens a linear domain by `pad` of its width on each side (a zero-width one by 1 or 10 %). */
export function padLinear([lo, hi]: [number, number], pad = 0.05): [number, number] {
  if (hi === lo) {
    const d = lo === 0 ? 1 : Math.abs(lo) * 0.1;
    return [lo - d, hi + d];
  }
  const d = (hi - lo) * pad;
  return [lo - d, hi + d];
}

/** Widens a positive domain outward to whole decades (a single value gets one decade each side). */
export function padLog([lo, hi]: [number, number]): [number, number] {
  let a = Math.floor(Math.log10(lo));
  let b = Math.ceil(Math.log10(hi));
  if (a === b) {
    a -= 1;
    b += 1;
  }
  return [10 ** a, 10 ** b];
}

/** About `target` evenly spaced ticks at 1, 2 or 5 times a power of ten within [min, max]. */
export function linearTicks(min: number, max: number, target = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || max < min) return [];
  if (max === min) return [min];
  const raw = (max - min) / Math.max(1, target);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const out: number[] = [];
  const first = Math.ceil(min / step - 1e-9);
  for (let i = first; i * step <= max + step * 1e-9; i++) out.push(Number((i * step).toPrecision(12)));
  return out;
}

/** Powers of ten within [min, max] (min > 0); with fewer than two decades also 2x and 5x; thinned to at most ~8. */
export function logTicks(min: number, max: number): number[] {
  if (!(min > 0) || !(max >= min)) return [];
  const a = Math.ceil(Math.log10(min) - 1e-9);
  const b = Math.floor(Math.log10(max) + 1e-9);
  let out: number[] = [];
  for (let e = a; e <= b; e++) out.push(Number((10 ** e).toPrecision(12)));
  if (out.length < 2) {
    out = [];
    for (let e = Math.floor(Math.log10(min)); e <= Math.ceil(Math.log10(max)); e++) {
      for (const m of [1, 2, 5]) {
        const v = Number((m * 10 ** e).toPrecision(12));
        if (v >= min * (1 - 1e-9) && v <= max * (1 + 1e-9)) out.push(v);
      }
    }
  }
  const every = Math.ceil(out.length / 8);
  return every > 1 ? out.filter((_, i) => i % every === 0) : out;
}

/** Short tick label: plain for 1e-3 <= |v| < 1e4, else "1e-18" style. */
export function formatTick(v: number): string {
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e4) return String(Number(v.toPrecision(3)));
  const e = Math.floor(Math.log10(a));
  const m = Number((v / 10 ** e).toPrecision(2));
  return m === 1 ? `1e${e}` : m === -1 ? `-1e${e}` : `${m}e${e}`;
}
