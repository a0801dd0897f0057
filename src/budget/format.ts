/** Number formatting for the budget's plain-language text (3 significant digits). */

/** A number with 3 significant digits, in exponent form when very large or small; "-" for null, "unbounded" for Infinity. */
export function fmt(x: number | null | undefined, digits = 3): string {
  if (x === null || x === undefined || Number.isNaN(x)) return '-';
  if (!Number.isFinite(x)) return x > 0 ? 'unbounded' : '-unbounded';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e5 || a < 1e-3) return x.toExponential(digits - 1).replace('e+', 'e');
  return String(Number(x.toPrecision(digits)));
}

/** Bytes as KiB/MiB/GiB/TiB with 3 significant digits. */
export function fmtBytes(bytes: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB'];
  let v = bytes;
  let i = 0;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${fmt(v)} ${units[i]}`;
}
