/**
 * Bonnor–Ebert spheres: our own solver of the isothermal Lane–Emden equation.
 *
 * A self-gravitating isothermal sphere in hydrostatic equilibrium has density
 * rho = rho_c exp(-psi(xi)) at radius r = a xi, a = c_s / sqrt(4 pi G rho_c), where
 *   (1/xi^2) d/dxi (xi^2 dpsi/dxi) = exp(-psi),  psi(0) = psi'(0) = 0
 * (Emden 1907; Chandrasekhar 1939). Truncated at xi_max and confined by an external pressure
 * P_0 = rho_c c_s^2 exp(-psi(xi_max)) it is a Bonnor–Ebert sphere (Bonnor 1956; Ebert 1955).
 * Its mass is M = 4 pi rho_c a^3 xi^2 psi'(xi), and the dimensionless mass
 *   m = M G^(3/2) P_0^(1/2) / c_s^4 = xi^2 psi' exp(-psi/2) / sqrt(4 pi)
 * peaks at the critical xi = 6.451, where the centre-to-edge contrast is 14.04 and m = 1.182.
 * Setting dm/dxi = 0 gives the condition exp(-psi) = psi'^2 / 2, solved here by bisection.
 *
 * Numerics: fourth-order Runge–Kutta on a uniform xi grid (step 1e-3 by default) after a
 * series start psi = xi^2/6 - xi^4/120 + xi^6/1890; cubic Hermite interpolation between nodes
 * (psi and psi' are both tabulated). Errors are near 1e-12 in psi. cgs units throughout.
 */
import { G } from './constants.js';

/** A tabulated solution psi(xi), psi'(xi) on xi = i * step, i = 0..n. */
export interface LaneEmdenTable {
  readonly step: number;
  readonly xiMax: number;
  readonly psi: Float64Array;
  readonly dpsi: Float64Array;
}

function rhs(xi: number, psi: number, dpsi: number, out: Float64Array): void {
  out[0] = dpsi;
  out[1] = Math.exp(-psi) - (2 * dpsi) / xi;
}

const k1 = new Float64Array(2), k2 = new Float64Array(2), k3 = new Float64Array(2), k4 = new Float64Array(2);

/** One RK4 step of length h from (xi, psi, dpsi) (xi > 0); writes [psi, dpsi] at xi + h into out. */
function rk4Step(xi: number, psi: number, dpsi: number, h: number, out: Float64Array): void {
  rhs(xi, psi, dpsi, k1);
  rhs(xi + h / 2, psi + (h / 2) * k1[0]!, dpsi + (h / 2) * k1[1]!, k2);
  rhs(xi + h / 2, psi + (h / 2) * k2[0]!, dpsi + (h / 2) * k2[1]!, k3);
  rhs(xi + h, psi + h * k3[0]!, dpsi + h * k3[1]!, k4);
  out[0] = psi + (h / 6) * (k1[0]! + 2 * k2[0]! + 2 * k3[0]! + k4[0]!);
  out[1] = dpsi + (h / 6) * (k1[1]! + 2 * k2[1]! + 2 * k3[1]! + k4[1]!);
}

/** Series solution near the centre, [psi, dpsi] at small xi (error ~ xi^8). */
function series(xi: number, out: Float64Array): void {
  const x2 = xi * xi;
  out[0] = x2 / 6 - (x2 * x2) / 120 + (x2 * x2 * x2) / 1890;
  out[1] = xi / 3 - (x2 * xi) / 30 + (x2 * x2 * xi) / 315;
}

/** Integrates the isothermal Lane–Emden equation from 0 to xiMax (dimensionless) with about the given step. */
export function solveLaneEmden(xiMax: number, step = 1e-3): LaneEmdenTable {
  if (!(xiMax > 0) || !Number.isFinite(xiMax)) throw new RangeError(`xi_max must be a positive finite number, got ${xiMax}`);
  if (xiMax > 1e5) throw new RangeError(`xi_max above 1e5 is not supported, got ${xiMax}`);
  const n = Math.max(2, Math.ceil(xiMax / step));
  const h = xiMax / n;
  const psi = new Float64Array(n + 1);
  const dpsi = new Float64Array(n + 1);
  const s = new Float64Array(2);
  series(h, s);
  psi[1] = s[0]!;
  dpsi[1] = s[1]!;
  for (let i = 1; i < n; i++) {
    rk4Step(i * h, psi[i]!, dpsi[i]!, h, s);
    psi[i + 1] = s[0]!;
    dpsi[i + 1] = s[1]!;
  }
  return { step: h, xiMax: n * h, psi, dpsi };
}

/** psi at xi (0 <= xi <= table.xiMax) by cubic Hermite interpolation of the table; dimensionless. */
export function laneEmdenPsi(t: LaneEmdenTable, xi: number): number {
  const h = t.step;
  let i = Math.floor(xi / h);
  if (i < 0) i = 0;
  const last = t.psi.length - 1;
  if (i >= last) i = last - 1;
  const u = xi / h - i;
  const u2 = u * u, u3 = u2 * u;
  const h00 = 2 * u3 - 3 * u2 + 1, h10 = u3 - 2 * u2 + u, h01 = -2 * u3 + 3 * u2, h11 = u3 - u2;
  return h00 * t.psi[i]! + h10 * h * t.dpsi[i]! + h01 * t.psi[i + 1]! + h11 * h * t.dpsi[i + 1]!;
}

/** [psi, psi'] at xi (0 <= xi <= table.xiMax) by one RK4 step from the node below; dimensionless. */
export function laneEmdenState(t: LaneEmdenTable, xi: number): [number, number] {
  const s = new Float64Array(2);
  if (xi <= t.step) {
    series(xi, s);
    return [s[0]!, s[1]!];
  }
  let i = Math.floor(xi / t.step);
  if (i >= t.psi.length - 1) i = t.psi.length - 2;
  const x0 = i * t.step;
  if (xi === x0) return [t.psi[i]!, t.dpsi[i]!];
  rk4Step(x0, t.psi[i]!, t.dpsi[i]!, xi - x0, s);
  return [s[0]!, s[1]!];
}

/** Dimensionless Bonnor–Ebert mass m = xi^2 psi' exp(-psi/2) / sqrt(4 pi) at xi (Bonnor 1956). */
export function dimensionlessMass(t: LaneEmdenTable, xi: number): number {
  const [psi, dpsi] = laneEmdenState(t, xi);
  return (xi * xi * dpsi * Math.exp(-psi / 2)) / Math.sqrt(4 * Math.PI);
}

/** The critical Bonnor–Ebert sphere: xi, centre-to-edge density contrast and dimensionless mass. */
export interface CriticalBonnorEbert {
  readonly xi: number;
  readonly contrast: number;
  readonly mass: number;
}

let criticalCache: CriticalBonnorEbert | null = null;
let sharedTable: LaneEmdenTable | null = null;

/** A cached table up to xi = 20 (enough for the critical sphere and most uses). */
function defaultTable(): LaneEmdenTable {
  if (!sharedTable) sharedTable = solveLaneEmden(20);
  return sharedTable;
}

/** The critical sphere, found from exp(-psi) = psi'^2/2 (dm/dxi = 0) by bisection; cached. */
export function criticalBonnorEbert(): CriticalBonnorEbert {
  if (criticalCache) return criticalCache;
  const t = defaultTable();
  const f = (xi: number): number => {
    const [psi, dpsi] = laneEmdenState(t, xi);
    return Math.exp(-psi) - (dpsi * dpsi) / 2;
  };
  let a = 1, b = 1;
  while (f(b) > 0) { a = b; b += 0.5; }
  for (let it = 0; it < 80; it++) {
    const m = (a + b) / 2;
    if (f(m) > 0) a = m;
    else b = m;
  }
  const xi = (a + b) / 2;
  const [psi] = laneEmdenState(t, xi);
  criticalCache = { xi, contrast: Math.exp(psi), mass: dimensionlessMass(t, xi) };
  return criticalCache;
}

/** A Bonnor–Ebert sphere in physical units (cgs). */
export interface BonnorEbertSphere {
  /** Dimensionless outer radius. */
  readonly xiMax: number;
  /** Central density, g/cm^3. */
  readonly centralDensity: number;
  /** Edge density, g/cm^3. */
  readonly edgeDensity: number;
  /** Scale length a = c_s / sqrt(4 pi G rho_c), cm. */
  readonly scaleLength: number;
  readonly radius: number;
  readonly mass: number;
  /** Confining pressure rho_edge c_s^2, dyn/cm^2. */
  readonly externalPressure: number;
  /** Solution table up to xiMax. */
  readonly table: LaneEmdenTable;
}

function sphereFromCentral(xiMax: number, rhoC: number, cs: number, t: LaneEmdenTable): BonnorEbertSphere {
  const [psi, dpsi] = laneEmdenState(t, xiMax);
  const a = cs / Math.sqrt(4 * Math.PI * G.value * rhoC);
  const edge = rhoC * Math.exp(-psi);
  return {
    xiMax,
    centralDensity: rhoC,
    edgeDensity: edge,
    scaleLength: a,
    radius: a * xiMax,
    mass: 4 * Math.PI * rhoC * a ** 3 * xiMax * xiMax * dpsi,
    externalPressure: edge * cs * cs,
    table: t,
  };
}

/** Resolves xi_max ('critical' or a number) and a table that reaches it. */
function tableFor(xiMax: number | 'critical'): { xi: number; t: LaneEmdenTable } {
  const xi = xiMax === 'critical' ? criticalBonnorEbert().xi : xiMax;
  const t = xi <= 20 ? defaultTable() : solveLaneEmden(xi);
  return { xi, t };
}

/** Bonnor–Ebert sphere of mass M (g) and sound speed c_s (cm/s) truncated at xiMax (or the critical one). */
export function bonnorEbertFromMass(mass: number, cs: number, xiMax: number | 'critical' = 'critical'): BonnorEbertSphere {
  const { xi, t } = tableFor(xiMax);
  const [, dpsi] = laneEmdenState(t, xi);
  // M = 4 pi rho_c a^3 xi^2 psi' = (4 pi)^(-1/2) c_s^3 G^(-3/2) rho_c^(-1/2) xi^2 psi'
  const rhoC = ((xi * xi * dpsi * cs ** 3) / (Math.sqrt(4 * Math.PI) * G.value ** 1.5 * mass)) ** 2;
  return sphereFromCentral(xi, rhoC, cs, t);
}

/** Bonnor–Ebert sphere of radius R (cm) and sound speed c_s (cm/s) truncated at xiMax (or the critical one). */
export function bonnorEbertFromRadius(radius: number, cs: number, xiMax: number | 'critical' = 'critical'): BonnorEbertSphere {
  const { xi, t } = tableFor(xiMax);
  // R = xi c_s / sqrt(4 pi G rho_c)
  const rhoC = (xi * xi * cs * cs) / (4 * Math.PI * G.value * radius * radius);
  return sphereFromCentral(xi, rhoC, cs, t);
}

/** Density, g/cm^3, of a Bonnor–Ebert sphere at radius r (cm); 0 beyond its edge. */
export function bonnorEbertDensity(s: BonnorEbertSphere, r: number): number {
  const xi = r / s.scaleLength;
  if (xi > s.xiMax) return 0;
  return s.centralDensity * Math.exp(-laneEmdenPsi(s.table, xi));
}
