/** svg-dendrogram: layout of the merge tree and its SVG. */
import { describe, expect, it } from 'vitest';
import { dendrogramSvg, layoutDendrogram } from '../src/report/svg-dendrogram.js';
import type { TreePlotNode } from '../src/report/plot-data.js';
import { fixtureTree } from './helpers/make-preview.js';

function chain(n: number): TreePlotNode[] {
  // a deep single chain: node i's parent is i+1
  return Array.from({ length: n }, (_, i) => ({ id: i, parent: i + 1 < n ? i + 1 : -1, mass_msun: i + 1, merge_density_gcc: 1e-18 / (i + 1), peak_density_gcc: 1e-17, state: 'stable' as const, candidate: i === 0 }));
}

describe('layoutDendrogram', () => {
  it('empty tree: no leaves; one node: one leaf at x = 0', () => {
    expect(layoutDendrogram([]).leaves).toBe(0);
    const one = layoutDendrogram([{ id: 0, parent: -1, mass_msun: 1, merge_density_gcc: 1e-19, peak_density_gcc: 1e-18, state: 'stable', candidate: false }]);
    expect(one.leaves).toBe(1);
    expect(one.x.get(0)).toBe(0);
  });
  it('places leaves 0..L-1 and each parent at its children\'s mean x, above its base', () => {
    const tree = fixtureTree();
    const L = layoutDendrogram(tree);
    const parents = new Set(tree.map((n) => n.parent));
    const leaves = tree.filter((n) => !parents.has(n.id));
    expect(L.leaves).toBe(leaves.length);
    expect([...leaves.map((n) => L.x.get(n.id))].sort()).toEqual([0, 1, 2]);
    for (const n of tree) {
      const kids = tree.filter((c) => c.parent === n.id);
      if (kids.length) expect(L.x.get(n.id)).toBeCloseTo(kids.reduce((s, c) => s + (L.x.get(c.id) as number), 0) / kids.length, 12);
      expect(L.top.get(n.id)!).toBeGreaterThanOrEqual(L.base.get(n.id)!);
    }
  });
  it('handles deep trees without recursion and keeps a subtree-closed set when truncating', () => {
    const deep = chain(20000);
    expect(layoutDendrogram(deep).leaves).toBe(1);
    const cut = layoutDendrogram(deep, 100);
    expect(cut.shown).toBe(100);
    const kept = new Set(cut.nodes.map((n) => n.id));
    for (const n of cut.nodes) if (n.parent >= 0) expect(kept.has(n.parent)).toBe(true);
  });
});

describe('dendrogramSvg', () => {
  it('draws one titled stroke per node and rings each candidate', () => {
    const tree = fixtureTree();
    const svg = dendrogramSvg(tree);
    expect((svg.match(/<svg/g) ?? []).length).toBe(1);
    expect((svg.match(/<title>node \d+:/g) ?? []).length).toBe(tree.length);
    expect((svg.match(/<circle /g) ?? []).length).toBe(tree.filter((n) => n.candidate).length + 1); // + legend sample
    expect(svg).toContain(`Merge tree (${tree.length} nodes)`);
    expect(dendrogramSvg([])).toContain('the tree is empty');
  });
});
