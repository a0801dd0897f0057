import { describe, it, expect } from 'vitest';
import { buildMergeTree, sortCellsAbove, neighbourOffsets } from '../src/survey/merge-tree.js';

const none = { minCells: 1, minContrast: 0, minMass: 0 };

describe('merge tree', () => {
  it('has no node when every cell is at or below the floor', () => {
    const t = buildMergeTree(new Float32Array(27).fill(1), { nx: 3, ny: 3, nz: 3 }, 1, 6, none, 1);
    expect(t.count).toBe(0);
    expect(t.labels.every((l) => l === -1)).toBe(true);
  });

  it('makes one node of one cell and of an all-equal cube', () => {
    expect(buildMergeTree(new Float32Array([2]), { nx: 1, ny: 1, nz: 1 }, 1, 6, none, 1).count).toBe(1);
    const t = buildMergeTree(new Float32Array(64).fill(2), { nx: 4, ny: 4, nz: 4 }, 1, 6, none, 1);
    expect(t.count).toBe(1);
    expect(t.cells[0]).toBe(64);
  });

  it('sorts cells by density like Array.prototype.sort (radix sort on float bits)', () => {
    let s = 5;
    const d = Float32Array.from({ length: 5000 }, () => { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; return 10 ** (6 * (s / 2 ** 32) - 20); });
    const ours = Array.from(sortCellsAbove(d, 1e-18)).map((c) => d[c]!);
    const ref = Array.from(d).filter((x) => x > 1e-18).sort((a, b) => a - b);
    expect(ours).toEqual(ref);
  });

  it('lists 6 face neighbours or all 26', () => {
    expect(neighbourOffsets(6).length).toBe(6);
    expect(neighbourOffsets(26).length).toBe(26);
  });

  it('joins diagonal cells only with 26-connectivity', () => {
    const d = new Float32Array(8);
    d[0] = 5; d[7] = 5; // (0,0,0) and (1,1,1)
    expect(buildMergeTree(d, { nx: 2, ny: 2, nz: 2 }, 1, 6, none, 1).roots.length).toBe(2);
    expect(buildMergeTree(d, { nx: 2, ny: 2, nz: 2 }, 1, 26, none, 1).roots.length).toBe(1);
  });

  it('keeps two peaks as children of the node where they meet, or absorbs the smaller under min_cells', () => {
    // a line of cells: peak 10, saddle 3, peak 8, on a floor of 1
    const line = new Float32Array([2, 10, 3, 8, 2]);
    const t = buildMergeTree(line, { nx: 1, ny: 1, nz: 5 }, 1, 6, none, 1);
    expect(t.count).toBe(3);
    const root = t.roots[0]!;
    expect(t.children[root]!.length).toBe(2);
    for (const c of t.children[root]!) expect(t.mergeDensity[c]).toBe(3);
    expect(t.cells[root]).toBe(5);
    expect(t.mergeDensity[root]).toBe(2);
    // ids: children before parents
    for (let id = 0; id < t.count; id++) if (t.parent[id]! >= 0) expect(t.parent[id]!).toBeGreaterThan(id);
    const strict = buildMergeTree(line, { nx: 1, ny: 1, nz: 5 }, 1, 6, { minCells: 2, minContrast: 0, minMass: 0 }, 1);
    expect(strict.count).toBe(1);
    const contrast = buildMergeTree(line, { nx: 1, ny: 1, nz: 5 }, 1, 6, { minCells: 1, minContrast: 2, minMass: 0 }, 1);
    expect(contrast.count).toBe(1); // 8 < (1 + 2) x 3
    const massLimit = buildMergeTree(line, { nx: 1, ny: 1, nz: 5 }, 1, 6, { minCells: 1, minContrast: 0, minMass: 9 }, 1);
    expect(massLimit.count).toBe(1); // the peak of 8 holds mass 8 < 9 at the saddle
  });

  it('drops a region that fails the limits at the floor', () => {
    const t = buildMergeTree(new Float32Array([1.2, 0, 0, 5, 5]), { nx: 1, ny: 1, nz: 5 }, 1, 6, { minCells: 2, minContrast: 0.5, minMass: 0 }, 1);
    expect(t.count).toBe(1);
    expect(t.labels[0]).toBe(-1);
    expect(t.labels[3]).toBe(0);
  });
});
