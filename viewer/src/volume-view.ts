/**
 * The 3D view: ray-marched density volume (Data3DTexture + ShaderMaterial), particles, candidate
 * markers with picking, and a box outline. World units: the box [-L/2, L/2)^3 maps to the unit
 * cube [-0.5, 0.5]^3 (x, y, z in pc divided by L). Renders on demand.
 */
import * as THREE from 'three';
import { OrbitControls } from 'three/addons/controls/OrbitControls.js';
import type { Candidate, PreviewData } from './preview-data.js';
import { logDensityBytes, positiveRange } from './preview-data.js';
import { VOLUME_FRAGMENT, VOLUME_VERTEX } from './volume-shader.js';
import { STATE_COLOURS, VIEW_BACKGROUND } from './colours.js';

/** What the page can do with the 3D view. */
export interface VolumeView {
  setThreshold(t: number): void;
  setParticlesVisible(v: boolean): void;
  setHighlight(mask: Uint8Array | null): void;
  /** Candidate under a client-space point, or null. */
  pick(clientX: number, clientY: number): Candidate | null;
  /** Client-space position of a candidate's marker centre. */
  screenPosition(id: number): { x: number; y: number } | null;
  densityRange: [number, number];
  render(): void;
  dispose(): void;
}

/** True when this browser gives a WebGL2 context. */
export function hasWebGL2(): boolean {
  try {
    const c = document.createElement('canvas');
    return !!c.getContext('webgl2');
  } catch {
    return false;
  }
}

function texture3D(bytes: Uint8Array, n: number, linear: boolean): THREE.Data3DTexture {
  const t = new THREE.Data3DTexture(bytes, n, n, n);
  t.format = THREE.RedFormat;
  t.type = THREE.UnsignedByteType;
  t.minFilter = linear ? THREE.LinearFilter : THREE.NearestFilter;
  t.magFilter = linear ? THREE.LinearFilter : THREE.NearestFilter;
  t.wrapS = t.wrapT = t.wrapR = THREE.ClampToEdgeWrapping;
  t.unpackAlignment = 1;
  t.needsUpdate = true;
  return t;
}

/** Builds the 3D view inside `host` (a positioned element) for the decoded preview. */
export function createVolumeView(host: HTMLElement, data: PreviewData): VolumeView {
  const renderer = new THREE.WebGLRenderer({ antialias: true, preserveDrawingBuffer: true });
  renderer.setPixelRatio(Math.min(2, window.devicePixelRatio || 1));
  renderer.setClearColor(new THREE.Color(VIEW_BACKGROUND), 1);
  host.appendChild(renderer.domElement);
  renderer.domElement.id = 'volume-canvas';

  const scene = new THREE.Scene();
  const camera = new THREE.PerspectiveCamera(40, 1, 0.01, 20);
  camera.position.set(1.25, 0.95, 1.55);
  const controls = new OrbitControls(camera, renderer.domElement);
  controls.target.set(0, 0, 0);
  controls.enableDamping = false;

  const range = positiveRange(data.density) ?? [1, 10];
  const densityBytes = logDensityBytes(data.density, range[0], range[1]);
  const maskBytes = new Uint8Array(data.density.length);
  const densityTex = texture3D(densityBytes, data.n, true);
  const maskTex = texture3D(maskBytes, data.n, false);
  const material = new THREE.ShaderMaterial({
    glslVersion: THREE.GLSL3,
    vertexShader: VOLUME_VERTEX,
    fragmentShader: VOLUME_FRAGMENT,
    uniforms: {
      uDensity: { value: densityTex },
      uMask: { value: maskTex },
      uThreshold: { value: 0.35 },
      uSteps: { value: Math.min(384, Math.max(96, data.n * 2)) },
      uOpacity: { value: 30 },
      uHighlight: { value: 0 },
    },
    side: THREE.BackSide,
    transparent: true,
    depthWrite: false,
  });
  const volume = new THREE.Mesh(new THREE.BoxGeometry(1, 1, 1), material);
  volume.renderOrder = 1;
  scene.add(volume);

  const outline = new THREE.LineSegments(new THREE.EdgesGeometry(new THREE.BoxGeometry(1, 1, 1)), new THREE.LineBasicMaterial({ color: 0x6f7c8a }));
  scene.add(outline);
  const axes = new THREE.AxesHelper(0.18);
  axes.position.set(-0.5, -0.5, -0.5);
  scene.add(axes);

  let points: THREE.Points | null = null;
  if (data.particles && data.particles.length >= 3) {
    const pos = new Float32Array(data.particles.length);
    for (let c = 0; c < pos.length; c++) pos[c] = data.particles[c] / data.boxPc;
    const g = new THREE.BufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(pos, 3));
    points = new THREE.Points(g, new THREE.PointsMaterial({ color: 0xd7dde4, size: 2, sizeAttenuation: false, transparent: true, opacity: 0.6, depthWrite: false }));
    points.renderOrder = 2;
    scene.add(points);
  }

  const markers: THREE.Mesh[] = [];
  const mmax = Math.max(1e-30, ...data.candidates.map((c) => c.mass_msun));
  for (const c of data.candidates) {
    const r = 0.018 + 0.018 * Math.cbrt(Math.max(0, c.mass_msun) / mmax);
    const m = new THREE.Mesh(
      new THREE.SphereGeometry(r, 20, 14),
      new THREE.MeshBasicMaterial({ color: new THREE.Color(STATE_COLOURS[c.state] ?? '#ffffff'), depthTest: false, transparent: true, opacity: 0.95 }),
    );
    m.position.set(c.position[0] / data.boxPc, c.position[1] / data.boxPc, c.position[2] / data.boxPc);
    m.renderOrder = 4;
    m.userData.candidate = c;
    // a dark rim drawn just before the marker, so it stands out on bright gas
    const rim = new THREE.Mesh(new THREE.SphereGeometry(r * 1.3, 20, 14), new THREE.MeshBasicMaterial({ color: 0x000000, side: THREE.BackSide, depthTest: false, transparent: true, opacity: 0.9 }));
    rim.renderOrder = 3;
    rim.raycast = () => {};
    m.add(rim);
    markers.push(m);
    scene.add(m);
  }

  const raycaster = new THREE.Raycaster();
  const resize = () => {
    const w = Math.max(1, host.clientWidth);
    const h = Math.max(1, host.clientHeight);
    renderer.setSize(w, h, false);
    renderer.domElement.style.width = `${w}px`;
    renderer.domElement.style.height = `${h}px`;
    camera.aspect = w / h;
    camera.updateProjectionMatrix();
    render();
  };
  const render = () => renderer.render(scene, camera);
  controls.addEventListener('change', render);
  const observer = new ResizeObserver(resize);
  observer.observe(host);
  resize();

  const toNdc = (clientX: number, clientY: number) => {
    const r = renderer.domElement.getBoundingClientRect();
    return new THREE.Vector2(((clientX - r.left) / r.width) * 2 - 1, -((clientY - r.top) / r.height) * 2 + 1);
  };

  return {
    densityRange: range,
    render,
    setThreshold(t) {
      material.uniforms.uThreshold.value = t;
      render();
    },
    setParticlesVisible(v) {
      if (points) points.visible = v;
      render();
    },
    setHighlight(mask) {
      if (mask) maskBytes.set(mask);
      maskTex.needsUpdate = true;
      material.uniforms.uHighlight.value = mask ? 1 : 0;
      render();
    },
    pick(clientX, clientY) {
      raycaster.setFromCamera(toNdc(clientX, clientY), camera);
      const hit = raycaster.intersectObjects(markers, false)[0];
      return hit ? (hit.object.userData.candidate as Candidate) : null;
    },
    screenPosition(id) {
      const m = markers.find((x) => (x.userData.candidate as Candidate).id === id);
      if (!m) return null;
      const v = m.position.clone().project(camera);
      const r = renderer.domElement.getBoundingClientRect();
      return { x: r.left + ((v.x + 1) / 2) * r.width, y: r.top + ((1 - v.y) / 2) * r.height };
    },
    dispose() {
      observer.disconnect();
      controls.dispose();
      renderer.dispose();
      densityTex.dispose();
      maskTex.dispose();
      renderer.domElement.remove();
    },
  };
}
