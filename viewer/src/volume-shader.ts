/**
 * GLSL (WebGL2, GLSL ES 3.00) for the ray-marched density volume. The box is the unit cube
 * [-0.5, 0.5]^3 in world units; texture coordinates are p + 0.5 swizzled to (z, y, x) because the
 * fields are C order (i*n + j)*n + k with k fastest, which a 3D texture stores as its width axis.
 * uDensity holds log-scaled density in [0, 1]; uMask marks highlighted cells (1) or not (0).
 */

export const VOLUME_VERTEX = /* glsl */ `
out vec3 vOrigin;
out vec3 vDirection;
void main() {
  vOrigin = cameraPosition;
  vDirection = position - cameraPosition;
  gl_Position = projectionMatrix * modelViewMatrix * vec4(position, 1.0);
}
`;

export const VOLUME_FRAGMENT = /* glsl */ `
precision highp float;
precision highp sampler3D;
uniform sampler3D uDensity;
uniform sampler3D uMask;
uniform float uThreshold;
uniform float uSteps;
uniform float uOpacity;
uniform float uHighlight;
in vec3 vOrigin;
in vec3 vDirection;
out vec4 fragColor;

vec2 hitBox(vec3 o, vec3 d) {
  vec3 inv = 1.0 / d;
  vec3 t0 = (vec3(-0.5) - o) * inv;
  vec3 t1 = (vec3(0.5) - o) * inv;
  vec3 lo = min(t0, t1);
  vec3 hi = max(t0, t1);
  return vec2(max(max(lo.x, lo.y), lo.z), min(min(hi.x, hi.y), hi.z));
}

// our own ramp: deep blue -> teal -> sand -> near white
vec3 ramp(float a) {
  vec3 c0 = vec3(0.10, 0.20, 0.55);
  vec3 c1 = vec3(0.10, 0.62, 0.66);
  vec3 c2 = vec3(0.93, 0.80, 0.45);
  vec3 c3 = vec3(1.00, 0.98, 0.92);
  if (a < 0.4) return mix(c0, c1, a / 0.4);
  if (a < 0.8) return mix(c1, c2, (a - 0.4) / 0.4);
  return mix(c2, c3, (a - 0.8) / 0.2);
}

void main() {
  vec3 dir = normalize(vDirection);
  vec2 b = hitBox(vOrigin, dir);
  if (b.x > b.y) discard;
  b.x = max(b.x, 0.0);
  float dt = (b.y - b.x) / uSteps;
  vec4 acc = vec4(0.0);
  for (int i = 0; i < 512; i++) {
    if (float(i) >= uSteps) break;
    vec3 p = vOrigin + (b.x + (float(i) + 0.5) * dt) * dir + 0.5;
    float v = texture(uDensity, p.zyx).r;
    float m = uHighlight > 0.5 ? texture(uMask, p.zyx).r : 0.0;
    float a = 0.0;
    vec3 col = vec3(0.0);
    if (v > uThreshold) {
      float t = (v - uThreshold) / max(1.0 - uThreshold, 1e-3);
      col = ramp(t);
      a = 1.0 - exp(-uOpacity * (0.15 + t * t) * dt);
    }
    if (m > 0.5) {
      col = mix(col, vec3(1.0, 0.35, 0.75), 0.75);
      a = max(a, 1.0 - exp(-10.0 * dt));
    }
    acc.rgb += (1.0 - acc.a) * a * col;
    acc.a += (1.0 - acc.a) * a;
    if (acc.a > 0.98) break;
  }
  if (acc.a < 0.002) discard;
  fragColor = vec4(acc.rgb / max(acc.a, 1e-4), acc.a);
}
`;
