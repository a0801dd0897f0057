/**
 * Self-gravitational energy of a set of grid cells from their own mass distribution, erg.
 *
 * Grid: shape (nx, ny, nz), C order, flat index (i*ny + j)*nz + k, i along x, cell-centred,
 * cubic cells of side dx = boxSize/nx (cm); density g/cm^3.
 *
 * W = (1/2) sum_i sum_j m_i m_j g(r_i - r_j), with g(r) = -G/|r| between distinct cells and,
 * for a cell with itself, the exact self-energy of a uniform cube of side a:
 * -(1/2) G m^2 D/a, D = mean inverse distance of two random points in a unit cube
 * (D = 1.882312644..., a classical box integral; checked numerically in the tests).
 *
 * Method: the cells' bounding box (b cells on its longest side) is coarse-grained by a
 * power-of-two factor f, the smallest with b/f <= gravityCells; each coarse cell's mass sits
 * in a uniform cube of side a = f dx. With at most DIRECT_SUM_LIMIT occupied cells the pair sum
 * is done directly (no further approximation). Otherwise the energy is computed on a pyramid
 * of grids, from 16 coarse cells per side upwards, each by isolated-boundary convolution
 * (Hockney & Eastwood 1981: the g^3 mass grid is zero-padded to (2g)^3 so the periodic FFT
 * convolution with the 1/r kernel has no image contributions) or the direct sum, doubling the
 * resolution until the estimated coarse-graining error |W_a - W_2a| / |W_a| is below the
 * tolerance (default 1 %) or the finest grid is reached. The error falls as a^p with p = 2 for
 * compact nodes and p ~ 1.3 measured on filamentary nodes of lognormal cubes, so the step
 * difference (the error of W_a for p = 1) is a safe upper estimate.
 * The estimate is returned with the energy, so every node carries its own error bound.
 * Measured (tests): a gridded uniform sphere 51 cells across, uncoarsened, is within 0.1 % of
 * -(3/5) G M^2/R; coarse-grained to 13 cells across, within 1 %; the a^2 scaling holds.
 */
import { G } from '../physics/constants.js';
import { realForward3, halfSpectrumLength, halfLength, forwardZ, complexAxis, axisLineCount } from '../grid/fft3.js';

/** Mean inverse distance of two independent uniform points in the unit cube (box integral; value from memory, verified numerically in test/outside/self-gravity.test.ts). */
export const UNIT_CUBE_MEAN_INVERSE_DISTANCE = 1.8823126444;

/** Gravitational self-energy of a uniform cube of mass m (g) and side a (cm), erg. */
export function uniformCubeSelfEnergy(m: number, a: number): number {
  return -0.5 * G.value * m * m * UNIT_CUBE_MEAN_INVERSE_DISTANCE / a;
}

/** Largest number of occupied coarse cells for which the direct pair sum is used. */
export const DIRECT_SUM_LIMIT = 800;

const greens = new Map<number, Float64Array>();

/** Half spectrum of the isolated kernel -1/|r| (cell units) on the (2g)^3 padded grid, cached by g. */
function greenSpectrum(g: number): Float64Array {
  let s = greens.get(g);
  if (s) return s;
  const n = 2 * g;
  const k = new Float64Array(n * n * n);
  for (let i = 0; i < n; i++) {
    const x = i <= g ? i : i - n;
    for (let j = 0; j < n; j++) {
      const y = j <= g ? j : j - n;
      for (let l = 0; l < n; l++) {
        const z = l <= g ? l : l - n;
        const r2 = x * x + y * y + z * z;
        k[(i * n + j) * n + l] = r2 === 0 ? -UNIT_CUBE_MEAN_INVERSE_DISTANCE : -1 / Math.sqrt(r2);
      }
    }
  }
  s = realForward3(k, { nx: n, ny: n, nz: n, boxSize: 1 });
  greens.set(g, s);
  return s;
}

const buffers = new Map<number, { padded: Float64Array; spec: Float64Array }>();

/**
 * Self-energy, erg, of masses (g) on a g^3 coarse grid (C order, g a power of two) of cells of
 * side a (cm), by isolated FFT convolution, summed in Fourier space (Parseval's theorem), so
 * only the forward transform runs. Lines that are zero in the padded input are not transformed.
 */
export function coarseGridSelfEnergy(mass: Float64Array, g: number, a: number): number {
  const n = 2 * g;
  const grid = { nx: n, ny: n, nz: n, boxSize: 1 };
  const nh = halfLength(n);
  let buf = buffers.get(g);
  if (!buf) {
    buf = { padded: new Float64Array(n * n * n), spec: new Float64Array(halfSpectrumLength(grid)) };
    buffers.set(g, buf);
  }
  const { padded, spec } = buf;
  for (let i = 0; i < g; i++) for (let j = 0; j < g; j++) {
    const src = (i * g + j) * g;
    padded.set(mass.subarray(src, src + g), (i * n + j) * n);
  }
  spec.fill(0);
  for (let i = 0; i < g; i++) forwardZ(padded, spec, grid, i * n, i * n + g);
  complexAxis(spec, grid, 1, false, 0, g * nh);
  complexAxis(spec, grid, 0, false, 0, axisLineCount(grid, 0));
  // Parseval: sum_x m(x) (K * m)(x) = (1/N) sum_k K(k) |M(k)|^2 over the full spectrum; the kernel
  // is even, so K is real, and the half spectrum counts the planes 0 < kz < n/2 twice
  const kern = greenSpectrum(g);
  let w = 0;
  for (let row = 0; row < n * n; row++) {
    const base = row * nh * 2;
    let s = 0;
    for (let l = 1; l < nh - 1; l++) {
      const p = base + 2 * l;
      s += kern[p]! * (spec[p]! * spec[p]! + spec[p + 1]! * spec[p + 1]!);
    }
    const p0 = base, p1 = base + 2 * (nh - 1);
    w += 2 * s + kern[p0]! * (spec[p0]! * spec[p0]! + spec[p0 + 1]! * spec[p0 + 1]!) + kern[p1]! * (spec[p1]! * spec[p1]! + spec[p1 + 1]! * spec[p1 + 1]!);
  }
  w /= n * n * n;
  return 0.5 * G.value * w / a;
}

/** Self-energy, erg, of point masses (g) at integer coarse positions xyz (interleaved) in cubes of side a (cm), by direct pair sum. */
export function directSelfEnergy(mass: Float64Array, xyz: Int32Array, a: number): number {
  let pair = 0;
  let self = 0;
  const n = mass.length;
  for (let p = 0; p < n; p++) {
    const mp = mass[p]!;
    self += mp * mp;
    const x = xyz[3 * p]!, y = xyz[3 * p + 1]!, z = xyz[3 * p + 2]!;
    let s = 0;
    for (let q = p + 1; q < n; q++) {
      const dx = xyz[3 * q]! - x, dy = xyz[3 * q + 1]! - y, dz = xyz[3 * q + 2]! - z;
      s += mass[q]! / Math.sqrt(dx * dx + dy * dy + dz * dz);
    }
    pair += mp * s;
  }
  return -G.value * (pair + 0.5 * UNIT_CUBE_MEAN_INVERSE_DISTANCE * self) / a;
}

/** A coarse-grained mass distribution ready for the energy sum. */
export interface CoarseMass {
  /** Coarse cells per side of the (power-of-two) FFT grid, g. */
  readonly g: number;
  /** Coarse-graining factor f (fine cells per coarse cell side). */
  readonly factor: number;
  /** Coarse cell side, cm. */
  readonly side: number;
  /** Mass per coarse cell, g, g^3 in C order. */
  readonly mass: Float64Array;
  /** Occupied coarse cells. */
  readonly occupied: number;
}

function nextPow2(x: number): number {
  let p = 1;
  while (p < x) p *= 2;
  return p;
}

/**
 * Deposits the mass of the listed cells (flat indices into a grid of shape nx, ny, nz with cell
 * side dx cm; density g/cm^3) onto a coarse grid of at most gravityCells cells per side, or with
 * the given power-of-two factor. Coarse cells are aligned on multiples of the factor in the
 * global grid, so the same cells give the same coarse grid whichever node they belong to.
 */
export function coarseGrain(density: Float32Array, shape: { nx: number; ny: number; nz: number }, dx: number, cells: Int32Array | null, gravityCells: number, forcedFactor?: number): CoarseMass {
  const { ny, nz } = shape;
  const count = cells ? cells.length : density.length;
  let i0 = Infinity, j0 = Infinity, k0 = Infinity, i1 = -1, j1 = -1, k1 = -1;
  for (let p = 0; p < count; p++) {
    const c = cells ? cells[p]! : p;
    if (!cells && !(density[c]! > 0)) continue;
    const i = Math.floor(c / (ny * nz)), j = Math.floor(c / nz) % ny, k = c % nz;
    if (i < i0) i0 = i; if (i > i1) i1 = i;
    if (j < j0) j0 = j; if (j > j1) j1 = j;
    if (k < k0) k0 = k; if (k > k1) k1 = k;
  }
  if (i1 < 0) return { g: 2, factor: forcedFactor ?? 1, side: dx * (forcedFactor ?? 1), mass: new Float64Array(8), occupied: 0 };
  const b = Math.max(i1 - i0, j1 - j0, k1 - k0) + 1;
  const factor = forcedFactor ?? nextPow2(Math.max(1, Math.ceil(b / gravityCells)));
  const ci0 = Math.floor(i0 / factor), cj0 = Math.floor(j0 / factor), ck0 = Math.floor(k0 / factor);
  const span = Math.max(Math.floor(i1 / factor) - ci0, Math.floor(j1 / factor) - cj0, Math.floor(k1 / factor) - ck0) + 1;
  const g = Math.max(2, nextPow2(span));
  const mass = new Float64Array(g * g * g);
  const vol = dx * dx * dx;
  for (let p = 0; p < count; p++) {
    const c = cells ? cells[p]! : p;
    const rho = density[c]!;
    if (!cells && !(rho > 0)) continue;
    const i = Math.floor(c / (ny * nz)), j = Math.floor(c / nz) % ny, k = c % nz;
    const q = ((Math.floor(i / factor) - ci0) * g + (Math.floor(j / factor) - cj0)) * g + (Math.floor(k / factor) - ck0);
    mass[q]! += rho * vol;
  }
  let occupied = 0;
  for (let q = 0; q < mass.length; q++) if (mass[q]! > 0) occupied++;
  return { g, factor, side: factor * dx, mass, occupied };
}

/** Cells given by their integer coordinates and densities (parallel arrays), e.g. a slice of a node's cell list. */
export interface CellSet {
  readonly i: Int32Array;
  readonly j: Int32Array;
  readonly k: Int32Array;
  /** g/cm^3 */
  readonly rho: Float32Array;
}

/** coarseGrain for cells given by coordinates (faster: no index arithmetic); factor a power of two (forced) or chosen from gravityCells. */
export function coarseGrainSet(set: CellSet, dx: number, gravityCells: number, forcedFactor?: number): CoarseMass {
  const { i: I, j: J, k: K, rho } = set;
  const count = rho.length;
  if (count === 0) return { g: 2, factor: forcedFactor ?? 1, side: dx * (forcedFactor ?? 1), mass: new Float64Array(8), occupied: 0 };
  let i0 = Infinity, j0 = Infinity, k0 = Infinity, i1 = -1, j1 = -1, k1 = -1;
  for (let p = 0; p < count; p++) {
    const i = I[p]!, j = J[p]!, k = K[p]!;
    if (i < i0) i0 = i; if (i > i1) i1 = i;
    if (j < j0) j0 = j; if (j > j1) j1 = j;
    if (k < k0) k0 = k; if (k > k1) k1 = k;
  }
  const b = Math.max(i1 - i0, j1 - j0, k1 - k0) + 1;
  const factor = forcedFactor ?? nextPow2(Math.max(1, Math.ceil(b / gravityCells)));
  const sh = Math.round(Math.log2(factor));
  const ci0 = i0 >> sh, cj0 = j0 >> sh, ck0 = k0 >> sh;
  const span = Math.max((i1 >> sh) - ci0, (j1 >> sh) - cj0, (k1 >> sh) - ck0) + 1;
  const g = Math.max(2, nextPow2(span));
  const mass = new Float64Array(g * g * g);
  const vol = dx * dx * dx;
  for (let p = 0; p < count; p++) {
    mass[(((I[p]! >> sh) - ci0) * g + ((J[p]! >> sh) - cj0)) * g + ((K[p]! >> sh) - ck0)]! += rho[p]! * vol;
  }
  let occupied = 0;
  for (let q = 0; q < mass.length; q++) if (mass[q]! > 0) occupied++;
  return { g, factor, side: factor * dx, mass, occupied };
}

function directOf(c: CoarseMass): number {
  const m = new Float64Array(c.occupied);
  const xyz = new Int32Array(3 * c.occupied);
  const g = c.g;
  for (let q = 0, p = 0; q < c.mass.length; q++) {
    if (!(c.mass[q]! > 0)) continue;
    m[p] = c.mass[q]!;
    xyz[3 * p] = Math.floor(q / (g * g));
    xyz[3 * p + 1] = Math.floor(q / g) % g;
    xyz[3 * p + 2] = q % g;
    p++;
  }
  return directSelfEnergy(m, xyz, c.side);
}

/** The same mass on a grid half as fine (2x2x2 blocks summed). */
export function halveCoarse(c: CoarseMass): CoarseMass {
  const g = c.g, h = g / 2;
  const mass = new Float64Array(h * h * h);
  for (let i = 0; i < g; i++) for (let j = 0; j < g; j++) {
    const src = (i * g + j) * g;
    const dst = ((i >> 1) * h + (j >> 1)) * h;
    for (let k = 0; k < g; k++) mass[dst + (k >> 1)]! += c.mass[src + k]!;
  }
  let occupied = 0;
  for (let q = 0; q < mass.length; q++) if (mass[q]! > 0) occupied++;
  return { g: h, factor: c.factor * 2, side: c.side * 2, mass, occupied };
}

/** Self-energy, erg, of one coarse mass grid: direct pair sum when few cells are occupied, else isolated FFT convolution. */
export function coarseSelfEnergy(c: CoarseMass): number {
  if (c.occupied === 0) return 0;
  return c.occupied <= DIRECT_SUM_LIMIT ? directOf(c) : coarseGridSelfEnergy(c.mass, c.g, c.side);
}

/** Coarse cells per side of the first (coarsest) level of the adaptive sum. */
export const ADAPTIVE_START_CELLS = 16;

/** Result of the adaptive self-gravity sum. */
export interface GravityEstimate {
  /** erg */
  energy: number;
  /** Fine cells per coarse cell side at the level used. */
  factor: number;
  /** Coarse cells per side at the level used. */
  cellsPerSide: number;
  /** Estimated relative coarse-graining error |W_a - W_2a| / |W_a| (0 when no coarse-graining was needed). */
  relativeError: number;
}

/**
 * Self-energy, erg, of a node given on its finest allowed coarse grid: exact pair sum when few
 * cells are occupied; otherwise from 16 coarse cells per side upwards, doubling the resolution
 * until the estimated coarse-graining error |W_a - W_2a| / |W_a| is below `tolerance` or the
 * finest grid is reached.
 */
export function adaptiveSelfEnergy(finest: CoarseMass, tolerance = 0.01): GravityEstimate {
  if (finest.occupied === 0) return { energy: 0, factor: finest.factor, cellsPerSide: finest.g, relativeError: 0 };
  if (finest.occupied <= DIRECT_SUM_LIMIT) return { energy: directOf(finest), factor: finest.factor, cellsPerSide: finest.g, relativeError: 0 };
  const levels: CoarseMass[] = [finest];
  while (levels[levels.length - 1]!.g > ADAPTIVE_START_CELLS) levels.push(halveCoarse(levels[levels.length - 1]!));
  let l = levels.length - 1;
  let coarse = coarseSelfEnergy(levels[l]!);
  if (l === 0) {
    // already at most 16 per side: estimate the error against the level below
    const half = halveCoarse(finest);
    const wc = coarseSelfEnergy(half);
    return { energy: coarse, factor: finest.factor, cellsPerSide: finest.g, relativeError: Math.abs(coarse - wc) / Math.abs(coarse) };
  }
  let err = Infinity;
  while (l > 0) {
    l--;
    const fine = coarseSelfEnergy(levels[l]!);
    err = Math.abs(fine - coarse) / Math.abs(fine);
    coarse = fine;
    if (err <= tolerance) break;
  }
  return { energy: coarse, factor: levels[l]!.factor, cellsPerSide: levels[l]!.g, relativeError: err };
}

/**
 * Self-gravitational energy, erg, of the listed cells (flat indices; null = every cell with
 * positive density) of a density cube (g/cm^3) with cubic cells of side dx (cm), coarse-grained
 * to at most gravityCells per side, refined adaptively to the given relative tolerance.
 */
export function selfGravityEnergy(
  density: Float32Array,
  shape: { nx: number; ny: number; nz: number },
  dx: number,
  cells: Int32Array | null = null,
  gravityCells = 64,
  tolerance = 0.01,
): GravityEstimate {
  return adaptiveSelfEnergy(coarseGrain(density, shape, dx, cells, gravityCells), tolerance);
}
