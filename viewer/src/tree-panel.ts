/**
 * The tree panel: "Tree: N nodes", then the nodes nested under their parents (children ordered by
 * id). Clicking a node calls `onSelect(id)`; clicking it again clears the selection.
 */
import type { TreePlotNode } from '../../src/report/plot-data.js';
import { STATE_COLOURS, STATE_LABELS } from './colours.js';

/** Fills `host` with the tree; returns a function that marks a node as selected (or none). */
export function buildTreePanel(host: HTMLElement, tree: readonly TreePlotNode[], onSelect: (id: number | null) => void): (id: number | null) => void {
  host.textContent = '';
  const head = document.createElement('h2');
  head.id = 'tree-count';
  head.textContent = `Tree: ${tree.length} node${tree.length === 1 ? '' : 's'}`;
  host.appendChild(head);
  if (tree.length === 0) {
    const p = document.createElement('p');
    p.textContent = 'No over-dense structure was found.';
    host.appendChild(p);
    return () => {};
  }
  const hint = document.createElement('p');
  hint.className = 'hint';
  hint.textContent = 'Click a node to light up its cells (with its descendants).';
  host.appendChild(hint);
  const ids = new Set(tree.map((n) => n.id));
  const kids = new Map<number, TreePlotNode[]>();
  const roots: TreePlotNode[] = [];
  for (const n of tree) {
    if (n.parent >= 0 && ids.has(n.parent)) {
      const list = kids.get(n.parent) ?? [];
      list.push(n);
      kids.set(n.parent, list);
    } else roots.push(n);
  }
  for (const l of kids.values()) l.sort((a, b) => a.id - b.id);
  roots.sort((a, b) => a.id - b.id);
  const buttons = new Map<number, HTMLButtonElement>();
  let selected: number | null = null;
  const mark = (id: number | null) => {
    if (selected !== null) buttons.get(selected)?.classList.remove('selected');
    selected = id;
    if (id !== null) buttons.get(id)?.classList.add('selected');
  };
  const list = document.createElement('ul');
  list.className = 'tree';
  host.appendChild(list);
  // iterative build (deep trees)
  const stack: Array<[TreePlotNode, HTMLUListElement]> = roots.slice().reverse().map((r) => [r, list]);
  while (stack.length) {
    const [n, parentUl] = stack.pop() as [TreePlotNode, HTMLUListElement];
    const li = document.createElement('li');
    const b = document.createElement('button');
    b.type = 'button';
    b.className = 'node';
    b.dataset.node = String(n.id);
    b.title = STATE_LABELS[n.state] ?? n.state;
    const dot = document.createElement('span');
    dot.className = 'dot';
    dot.style.background = STATE_COLOURS[n.state] ?? '#999';
    b.appendChild(dot);
    const depth = Number(parentUl.dataset.depth ?? '0');
    b.appendChild(document.createTextNode(`#${n.id} ${n.mass_msun.toPrecision(3)} Msun${n.candidate ? ' (candidate)' : ''}${depth > 8 ? ` [depth ${depth}]` : ''}`));
    b.addEventListener('click', () => {
      const next = selected === n.id ? null : n.id;
      mark(next);
      onSelect(next);
    });
    buttons.set(n.id, b);
    li.appendChild(b);
    parentUl.appendChild(li);
    const children = kids.get(n.id) ?? [];
    if (children.length) {
      const ul = document.createElement('ul');
      // merge trees can be deep chains: indent the first levels only, then list flat
      ul.dataset.depth = String(depth + 1);
      ul.style.paddingLeft = depth + 1 <= 8 ? '12px' : '0';
      li.appendChild(ul);
      for (let i = children.length - 1; i >= 0; i--) stack.push([children[i], ul]);
    }
  }
  return mark;
}
