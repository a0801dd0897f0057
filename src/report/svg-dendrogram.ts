/**
 * The merge tree as a dendrogram-style SVG: leaves spread along x in depth-first order, density on
 * a log y axis. Each node is a vertical stroke from the level where it splits off its parent up to
 * where it splits into its children (a leaf: up to its peak density); a horizontal bar joins the
 * children. Colour = state; a ring marks fragment candidates.
 */
import type { TreePlotNode } from './plot-data.js';
import { axes, COLOURS, emptyPlot, legend, makeFrame, px, svgElement } from './svg-frame.js';
import { extent, padLog } from './svg-scale.js';
import { escapeHtml } from './html-escape.js';
import { formatNumber } from './format-number.js';

/** Largest number of nodes drawn; bigger trees show their most massive nodes (a subtree-closed set). */
export const MAX_DRAWN_NODES = 1500;

/** Layout of the drawn nodes: x (leaf units), base and top density (g/cm^3). */
export interface DendrogramLayout {
  nodes: TreePlotNode[];
  x: Map<number, number>;
  base: Map<number, number>;
  top: Map<number, number>;
  children: Map<number, number[]>;
  leaves: number;
  shown: number;
  total: number;
}

/** Positions every kept node: leaves at 0, 1, 2 ... in depth-first order (children by id), parents at their children's mean. */
export function layoutDendrogram(all: readonly TreePlotNode[], maxNodes = MAX_DRAWN_NODES): DendrogramLayout {
  let nodes = all.slice();
  if (nodes.length > maxNodes) {
    const cut = nodes.map((n) => n.mass_msun).sort((a, b) => b - a)[maxNodes - 1];
    nodes = nodes.filter((n) => n.mass_msun >= cut);
  }
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const children = new Map<number, number[]>();
  const roots: number[] = [];
  for (const n of nodes) {
    if (n.parent >= 0 && byId.has(n.parent)) {
      const list = children.get(n.parent) ?? [];
      list.push(n.id);
      children.set(n.parent, list);
    } else roots.push(n.id);
  }
  for (const list of children.values()) list.sort((a, b) => a - b);
  roots.sort((a, b) => a - b);
  const x = new Map<number, number>();
  const top = new Map<number, number>();
  const base = new Map<number, number>();
  let leaf = 0;
  // iterative post-order so deep trees do not overflow the stack
  const stack: Array<[number, boolean]> = roots.slice().reverse().map((r) => [r, false]);
  while (stack.length) {
    const [id, done] = stack.pop() as [number, boolean];
    const kids = children.get(id) ?? [];
    const n = byId.get(id) as TreePlotNode;
    if (!done && kids.length > 0) {
      stack.push([id, true]);
      for (let i = kids.length - 1; i >= 0; i--) stack.push([kids[i], false]);
      continue;
    }
    if (kids.length === 0) {
      x.set(id, leaf++);
      top.set(id, Math.max(n.peak_density_gcc, n.merge_density_gcc));
    } else {
      x.set(id, kids.reduce((s, k) => s + (x.get(k) as number), 0) / kids.length);
      top.set(id, Math.min(...kids.map((k) => (byId.get(k) as TreePlotNode).merge_density_gcc)));
    }
  }
  for (const n of nodes) {
    const parentTop = n.parent >= 0 && byId.has(n.parent) ? (top.get(n.parent) as number) : n.merge_density_gcc;
    base.set(n.id, Math.min(parentTop, top.get(n.id) as number));
  }
  return { nodes, x, base, top, children, leaves: leaf, shown: nodes.length, total: all.length };
}

/** The tree as one <svg>: strokes coloured by state, candidates ringed, a legend of states. */
export function dendrogramSvg(all: readonly TreePlotNode[]): string {
  const title = `Merge tree (${all.length} nodes)`;
  if (all.length === 0) return emptyPlot('plot-tree', title, 'No over-dense structure found: the tree is empty.');
  const L = layoutDendrogram(all);
  const dens = extent([...L.base.values(), ...L.top.values()], true) ?? [1e-20, 1e-18];
  const yr = padLog(dens);
  const width = Math.max(540, Math.min(1100, 40 + 8 * L.leaves));
  const f = makeFrame({ label: '', log: false, min: -0.6, max: Math.max(0.6, L.leaves - 0.4) }, { label: '', log: true, min: yr[0], max: yr[1] }, width, 380);
  const out: string[] = [axes(f, L.shown < L.total ? `leaves in tree order (the ${L.shown} most massive of ${L.total} nodes)` : 'leaves in tree order', 'density (g cm^-3)', title, false)];
  for (const n of L.nodes) {
    const X = px(f.x(L.x.get(n.id) as number));
    const colour = COLOURS.states[n.state] ?? COLOURS.axis;
    const y0 = f.y(L.base.get(n.id) as number);
    const y1 = f.y(L.top.get(n.id) as number);
    out.push(
      `<line x1="${X}" y1="${px(y0)}" x2="${X}" y2="${px(y1)}" stroke="${colour}" stroke-width="2"><title>node ${n.id}: ${escapeHtml(formatNumber(n.mass_msun))} Msun, ${n.state}</title></line>`,
    );
    const kids = L.children.get(n.id) ?? [];
    if (kids.length > 1) {
      const xs = kids.map((k) => f.x(L.x.get(k) as number));
      out.push(`<line x1="${px(Math.min(...xs))}" y1="${px(y1)}" x2="${px(Math.max(...xs))}" y2="${px(y1)}" stroke="${colour}" stroke-width="2"/>`);
    }
    if (n.candidate) out.push(`<circle cx="${X}" cy="${px(y1)}" r="4" fill="#ffffff" stroke="${colour}" stroke-width="2"/>`);
  }
  const lg = legend(f, [
    { label: 'bound and Jeans-unstable', colour: COLOURS.states['bound-unstable'] },
    { label: 'Jeans-unstable, not bound', colour: COLOURS.states.unstable },
    { label: 'stable', colour: COLOURS.states.stable },
    { label: 'fragment candidate', colour: COLOURS.axis, ring: true },
  ]);
  out.push(lg.svg);
  return svgElement(f, 'plot-tree', title, out.join(''), lg.height);
}
