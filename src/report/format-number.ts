/**
 * One way to print a number, shared by report.html and the terminal summary so that both show
 * the same digits: integers as they are, other values to 3 significant figures.
 */

/** Formats a number for people: integers below 1e6 in full, else 3 significant figures (exponent form outside [0.01, 1e4)); non-finite or missing -> "n/a". */
export function formatNumber(x: number | null | undefined): string {
  if (x === null || x === undefined || !Number.isFinite(x)) return 'n/a';
  if (Number.isInteger(x) && Math.abs(x) < 1e6) return String(x);
  const a = Math.abs(x);
  if (a !== 0 && (a >= 1e4 || a < 1e-2)) return x.toExponential(2);
  return x.toPrecision(3);
}
