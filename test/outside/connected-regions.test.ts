/**
 * Source: scipy.ndimage.label (general-purpose reference library).
 * Connected regions of the merge tree against scipy.ndimage.label on the same cube
 * (scipy, the general-purpose reference library; Debian's python3-scipy).
 */
import { describe, it, expect } from 'vitest';
import { pythonJson } from '../helpers/python.js';
import { buildMergeTree } from '../../src/survey/merge-tree.js';

/** A seeded smooth random cube (box-filtered LCG noise, periodic), values in (0, ~3). */
function smoothCube(n: number, seed: number): Float32Array {
  let s = seed >>> 0;
  const raw = new Float64Array(n ** 3);
  for (let i = 0; i < raw.length; i++) { s = (Math.imul(s, 1664525) + 1013904223) >>> 0; raw[i] = s / 2 ** 32; }
  const out = new Float32Array(n ** 3);
  const w = 2;
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) for (let k = 0; k < n; k++) {
    let a = 0;
    for (let di = -w; di <= w; di++) for (let dj = -w; dj <= w; dj++) for (let dk = -w; dk <= w; dk++) {
      a += raw[(((i + di + n) % n) * n + ((j + dj + n) % n)) * n + ((k + dk + n) % n)]!;
    }
    out[(i * n + j) * n + k] = Math.exp(8 * (a / (2 * w + 1) ** 3 - 0.5));
  }
  return out;
}

describe('connected regions above a threshold', () => {
  const n = 24;
  const cube = smoothCube(n, 99);
  const thresholds = [0.8, 1.0, 1.3, 1.8];
  for (const connectivity of [6, 26] as const) {
    it(`match scipy.ndimage.label in count and masses (connectivity ${connectivity})`, () => {
      // With no significance limits every region is kept; the roots of a tree built above a
      // threshold are then exactly the connected regions above it.
      const ours = thresholds.map((t) => {
        const tree = buildMergeTree(cube, { nx: n, ny: n, nz: n }, t, connectivity, { minCells: 1, minContrast: 0, minMass: 0 }, 1);
        const mass = new Map<number, number>();
        const rootOf = (id: number): number => { while (tree.parent[id]! >= 0) id = tree.parent[id]!; return id; };
        for (let c = 0; c < cube.length; c++) {
          const l = tree.labels[c]!;
          if (l < 0) continue;
          const r = rootOf(l);
          mass.set(r, (mass.get(r) ?? 0) + cube[c]!);
        }
        expect(mass.size).toBe(tree.roots.length);
        return [...mass.values()].sort((a, b) => b - a);
      });
      const ref = pythonJson<number[][]>(`import sys, json, numpy as np
from scipy import ndimage
a=np.array(json.loads(sys.stdin.read()),dtype=np.float32).reshape(${n},${n},${n})
st=ndimage.generate_binary_structure(3, ${connectivity === 6 ? 1 : 3})
out=[]
for t in ${JSON.stringify(thresholds)}:
    lab,k=ndimage.label(a>np.float32(t), structure=st)
    m=ndimage.sum(a.astype(np.float64), lab, index=np.arange(1,k+1)) if k else []
    out.append(sorted([float(x) for x in m], reverse=True))
print(json.dumps(out))`, JSON.stringify(Array.from(cube)));
      for (let t = 0; t < thresholds.length; t++) {
        expect(ours[t]!.length).toBe(ref[t]!.length);
        ours[t]!.forEach((m, i) => expect(Math.abs(m / ref[t]![i]! - 1)).toBeLessThan(1e-9));
      }
      expect(ref.some((r) => r.length > 1)).toBe(true);
    });
  }
});
