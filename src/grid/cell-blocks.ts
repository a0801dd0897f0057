/**
 * Whole-grid passes in blocks of cells. A sum over every cell in cell order runs through a small
 * kernel called once per block (cells [a, b)), its running values kept in a Float64Array between
 * calls: the same additions in the same order as one loop, but V8 optimises a function called many
 * times as a whole, while one long call runs as on-stack-replaced code that boxes every double it
 * carries from one iteration to the next (measured 1.3-2x slower on 256^3 grids). Constants such as
 * Infinity that a loop merges into a running double are best read from a Float64Array too.
 */

/** Cells per block. */
export const CELL_BLOCK = 1 << 16;

/** Calls kernel(a, b) for consecutive blocks [a, b) of CELL_BLOCK cells covering [0, n), in order. */
export function forCellBlocks(n: number, kernel: (a: number, b: number) => void): void {
  for (let a = 0; a < n; a += CELL_BLOCK) kernel(a, Math.min(n, a + CELL_BLOCK));
}
