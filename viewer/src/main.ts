/**
 * The fragplan viewer page: loads a preview.zip (served at run/preview.zip by `fragplan view`,
 * or opened / dropped by the user), then shows the density volume with candidate markers, the tree
 * panel, the Jeans-number slice and the mass spectrum. No network beyond the page's own origin.
 */
import type { Candidate, PreviewData } from './preview-data.js';
import { fillMask, subtreeIds } from './preview-data.js';
import { openPreview } from './load-zip.js';
import { createVolumeView, hasWebGL2, type VolumeView } from './volume-view.js';
import { buildTreePanel } from './tree-panel.js';
import { countAbove, drawJeansSlice, jeansLogRange, type SliceAxis } from './jeans-slice.js';
import { massSpectrumSvg } from './mass-plot.js';
import { STATE_COLOURS, STATE_LABELS } from './colours.js';

/** What the page exposes for scripted checks (the browser test) and the console. */
interface ViewerHandle {
  ready: boolean;
  nodeCount: number;
  candidates: Array<{ id: number; mass_msun: number; state: string }>;
  candidateScreenPosition(id: number): { x: number; y: number } | null;
  webgl: boolean;
}
declare global {
  interface Window {
    fragplanViewer?: ViewerHandle;
  }
}

const $ = <T extends HTMLElement>(id: string) => document.getElementById(id) as T;
let view: VolumeView | null = null;

function setStatus(text: string): void {
  $('status').textContent = text;
}

function fmt(x: number): string {
  if (!Number.isFinite(x)) return 'n/a';
  if (Number.isInteger(x) && Math.abs(x) < 1e6) return String(x);
  const a = Math.abs(x);
  return a !== 0 && (a >= 1e4 || a < 1e-2) ? x.toExponential(2) : x.toPrecision(3);
}

function candidateText(c: Candidate): string {
  return `Candidate #${c.id}: ${fmt(c.mass_msun)} Msun, ${STATE_LABELS[c.state] ?? c.state}`;
}

function showCandidate(c: Candidate): void {
  const el = $('pick-info');
  el.textContent = candidateText(c);
  el.dataset.candidate = String(c.id);
  el.style.borderLeft = `6px solid ${STATE_COLOURS[c.state] ?? '#999'}`;
}

function summaryBox(data: PreviewData): void {
  const host = $('summary-box');
  host.textContent = '';
  const h = document.createElement('h2');
  h.textContent = 'Run';
  host.appendChild(h);
  const s = data.summary;
  const verdict = s?.resolution?.verdict as { status?: string; reason?: string } | string | undefined;
  if (verdict) {
    const p = document.createElement('p');
    p.className = 'verdict';
    p.textContent = typeof verdict === 'string' ? `Resolution: ${verdict}` : `Resolution: ${verdict.status ?? ''}`;
    const reason = typeof verdict === 'string' ? s?.resolution?.verdict_reason : verdict.reason;
    if (typeof reason === 'string' && reason) p.title = reason;
    host.appendChild(p);
  }
  const dl = document.createElement('dl');
  dl.className = 'numbers';
  const rows: Array<[string, string]> = [
    ['Preview cells', `${data.n}^3 (from ${data.manifest.source_cells}^3)`],
    ['Box', `${fmt(data.boxPc)} pc`],
  ];
  const h2 = s?.hierarchy as Record<string, unknown> | undefined;
  if (typeof h2?.fragment_candidates === 'number') rows.push(['Fragment candidates', fmt(h2.fragment_candidates)]);
  if (typeof h2?.expected_fragments === 'number') rows.push(['Expected fragments', fmt(h2.expected_fragments)]);
  if (typeof s?.cloud?.jeans_mass_msun === 'number') rows.push([`Jeans mass (${String(s.cloud.jeans_mass_definition).split(':')[0]})`, `${fmt(s.cloud.jeans_mass_msun)} Msun`]);
  for (const [k, v] of rows) {
    const dt = document.createElement('dt');
    dt.textContent = k;
    const dd = document.createElement('dd');
    dd.textContent = v;
    dl.append(dt, dd);
  }
  host.appendChild(dl);
}

function candidateList(data: PreviewData): void {
  const host = $('candidate-list');
  host.textContent = '';
  const h = document.createElement('h2');
  h.textContent = `Candidates: ${data.candidates.length}`;
  host.appendChild(h);
  for (const c of data.candidates) {
    const b = document.createElement('button');
    b.type = 'button';
    b.className = 'cand';
    b.dataset.candidate = String(c.id);
    const dot = document.createElement('span');
    dot.className = 'dot';
    dot.style.cssText = `display:inline-block;width:10px;height:10px;border-radius:50%;margin-right:5px;background:${STATE_COLOURS[c.state] ?? '#999'}`;
    b.append(dot, document.createTextNode(`#${c.id} ${fmt(c.mass_msun)} Msun`));
    b.addEventListener('click', () => showCandidate(c));
    host.appendChild(b);
  }
}

function legend(): void {
  const host = $('legend');
  host.innerHTML = '';
  for (const s of ['bound-unstable', 'unstable', 'stable']) {
    const row = document.createElement('div');
    const dot = document.createElement('span');
    dot.className = 'dot';
    dot.style.background = STATE_COLOURS[s];
    row.append(dot, document.createTextNode(STATE_LABELS[s]));
    host.appendChild(row);
  }
}

function sliceView(data: PreviewData): void {
  const limit = data.plots?.jeans_histogram?.limit ?? 0.25;
  const range = jeansLogRange(data.jeans, limit);
  const axisSel = $('slice-axis') as unknown as HTMLSelectElement;
  const idx = $('slice-index') as HTMLInputElement;
  idx.max = String(data.n - 1);
  // start on the slice with the most over-limit cells
  let best = Math.floor(data.n / 2);
  let bestCount = -1;
  for (let s = 0; s < data.n; s++) {
    const c = countAbove(data.jeans, data.n, 'z', s, limit);
    if (c > bestCount) [best, bestCount] = [s, c];
  }
  idx.value = String(best);
  const draw = () => {
    const axis = axisSel.value as SliceAxis;
    const s = Number(idx.value);
    drawJeansSlice($('jeans-canvas') as HTMLCanvasElement, data.jeans, data.n, axis, s, limit, range);
    const pos = -data.boxPc / 2 + ((s + 0.5) * data.boxPc) / data.n;
    $('slice-label').textContent = `${axis} = ${pos.toFixed(3)} pc (${s + 1}/${data.n}); ${countAbove(data.jeans, data.n, axis, s, limit)} cells above J = ${Number(limit.toPrecision(3))}`;
  };
  axisSel.onchange = draw;
  idx.oninput = draw;
  draw();
}

function volume(data: PreviewData): void {
  view?.dispose();
  view = null;
  const msg = $('gl-message');
  msg.hidden = true;
  if (!hasWebGL2()) {
    msg.textContent = 'WebGL2 is not available in this browser, so the 3D view is off. The tree, the Jeans slice and the mass spectrum still work.';
    msg.hidden = false;
    return;
  }
  try {
    view = createVolumeView($('gl-host'), data);
  } catch (e) {
    msg.textContent = `The 3D view could not start (${(e as Error).message}). The other panels still work.`;
    msg.hidden = false;
    return;
  }
  const v = view;
  const slider = $('threshold') as HTMLInputElement;
  // start at the cloud's mean density when the run gives it: the over-dense gas shows
  const mean = data.summary?.cloud?.mean_density_gcc;
  const [lo0, hi0] = v.densityRange;
  if (typeof mean === 'number' && mean > lo0 && mean < hi0 && hi0 > lo0) {
    slider.value = String(Math.min(0.9, Math.max(0, (Math.log10(mean) - Math.log10(lo0)) / (Math.log10(hi0) - Math.log10(lo0)))));
  }
  const label = () => {
    const t = Number(slider.value);
    const [lo, hi] = v.densityRange;
    const rho = 10 ** (Math.log10(lo) + t * (Math.log10(hi) - Math.log10(lo)));
    $('threshold-value').textContent = `rho > ${rho.toExponential(2)} g cm^-3`;
  };
  slider.oninput = () => {
    v.setThreshold(Number(slider.value));
    label();
  };
  v.setThreshold(Number(slider.value));
  label();
  const pt = $('particles-toggle');
  pt.hidden = !data.particles;
  ($('particles') as HTMLInputElement).onchange = (e) => v.setParticlesVisible((e.target as HTMLInputElement).checked);
  const canvas = $('gl-host').querySelector('canvas') as HTMLCanvasElement;
  const tip = $('hover-tip');
  canvas.addEventListener('pointermove', (e) => {
    const c = v.pick(e.clientX, e.clientY);
    if (!c) {
      tip.hidden = true;
      canvas.style.cursor = '';
      return;
    }
    const r = $('view3d').getBoundingClientRect();
    tip.textContent = `${fmt(c.mass_msun)} Msun (#${c.id})`;
    tip.style.left = `${e.clientX - r.left + 12}px`;
    tip.style.top = `${e.clientY - r.top + 12}px`;
    tip.hidden = false;
    canvas.style.cursor = 'pointer';
  });
  let down: [number, number] | null = null;
  canvas.addEventListener('pointerdown', (e) => (down = [e.clientX, e.clientY]));
  canvas.addEventListener('pointerup', (e) => {
    if (down && Math.hypot(e.clientX - down[0], e.clientY - down[1]) < 5) {
      const c = v.pick(e.clientX, e.clientY);
      if (c) showCandidate(c);
    }
    down = null;
  });
}

function show(data: PreviewData, source: string): void {
  $('run-name').textContent = data.summary?.name ?? '';
  setStatus(`${source}: ${data.n}^3 preview of a ${data.manifest.source_cells}^3 grid, box ${fmt(data.boxPc)} pc`);
  legend();
  summaryBox(data);
  candidateList(data);
  volume(data);
  const mark = buildTreePanel($('tree-panel'), data.tree, (id) => {
    const info = $('pick-info');
    delete info.dataset.candidate;
    info.style.borderLeft = '';
    if (id === null) {
      view?.setHighlight(null);
      info.textContent = 'Selection cleared.';
      return;
    }
    const mask = new Uint8Array(data.labels.length);
    const cells = fillMask(data.labels, subtreeIds(data.tree, id), mask);
    view?.setHighlight(mask);
    const node = data.tree.find((n) => n.id === id);
    info.textContent = `Node #${id}: ${node ? fmt(node.mass_msun) : '?'} Msun, ${node ? STATE_LABELS[node.state] : ''}; ${cells} preview cells lit`;
  });
  mark(null);
  sliceView(data);
  $('mass-plot').innerHTML = massSpectrumSvg(data.plots?.mass_spectrum ?? null);
  window.fragplanViewer = {
    ready: true,
    nodeCount: data.tree.length,
    candidates: data.candidates.map((c) => ({ id: c.id, mass_msun: c.mass_msun, state: c.state })),
    candidateScreenPosition: (id) => view?.screenPosition(id) ?? null,
    webgl: view !== null,
  };
  document.body.dataset.state = 'ready';
}

async function loadBytes(bytes: ArrayBuffer, source: string): Promise<void> {
  document.body.dataset.state = 'loading';
  setStatus(`Reading ${source}…`);
  try {
    show(await openPreview(bytes), source);
  } catch (e) {
    document.body.dataset.state = 'error';
    setStatus(`Could not read ${source}: ${(e as Error).message}`);
  }
}

function fileInputs(): void {
  ($('file-input') as HTMLInputElement).addEventListener('change', async (e) => {
    const f = (e.target as HTMLInputElement).files?.[0];
    if (f) await loadBytes(await f.arrayBuffer(), f.name);
  });
  const hint = $('drop-hint');
  window.addEventListener('dragover', (e) => {
    e.preventDefault();
    hint.hidden = false;
  });
  window.addEventListener('dragleave', (e) => {
    if (e.relatedTarget === null) hint.hidden = true;
  });
  window.addEventListener('drop', async (e) => {
    e.preventDefault();
    hint.hidden = true;
    const f = e.dataTransfer?.files?.[0];
    if (f) await loadBytes(await f.arrayBuffer(), f.name);
  });
}

async function start(): Promise<void> {
  fileInputs();
  if (!location.protocol.startsWith('http')) {
    document.body.dataset.state = 'empty';
    setStatus('Open or drop a preview.zip.');
    return;
  }
  const asked = new URLSearchParams(location.search).get('zip') ?? 'run/preview.zip';
  const url = new URL(asked, location.href);
  if (url.origin !== location.origin) {
    document.body.dataset.state = 'error';
    setStatus('Only a preview.zip from this server can be loaded by URL; open or drop a file instead.');
    return;
  }
  try {
    const res = await fetch(url.href);
    if (!res.ok) throw new Error(`HTTP ${res.status}`);
    await loadBytes(await res.arrayBuffer(), 'run/preview.zip');
  } catch (e) {
    document.body.dataset.state = 'empty';
    setStatus(`No run served here (${(e as Error).message}): open or drop a preview.zip.`);
  }
}

void start();
