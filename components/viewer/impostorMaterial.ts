/**
 * Sphere impostors: one quad per atom, shaded as a sphere, with the true depth of the sphere surface
 * written to gl_FragDepth so impostors intersect each other and the bonds correctly, for orthographic
 * and perspective cameras alike. The formulas are those of lib/view/impostor.ts (tested there against
 * three.js's camera maths). The slab and the cluster ball are uniforms: an atom whose centre is outside
 * is collapsed in the vertex shader, so changing a slice never rebuilds a buffer.
 */
import * as THREE from 'three';
import type { Ball, Slab } from '@/lib/view/slab';

/** Uniforms shared by atoms and bonds: which part of the structure is shown. */
export interface ClipUniforms {
  slabOn: { value: number };
  slabNormal: { value: THREE.Vector3 };
  slabLo: { value: number };
  slabHi: { value: number };
  ballOn: { value: number };
  ballCentre: { value: THREE.Vector3 };
  ballRadius: { value: number };
  [name: string]: THREE.IUniform;
}

export function createClipUniforms(): ClipUniforms {
  return {
    slabOn: { value: 0 },
    slabNormal: { value: new THREE.Vector3(0, 0, 1) },
    slabLo: { value: -1e9 },
    slabHi: { value: 1e9 },
    ballOn: { value: 0 },
    ballCentre: { value: new THREE.Vector3() },
    ballRadius: { value: 1e9 },
  };
}

/** Set the clip uniforms from a slab and a ball (null = off). */
export function applyClip(clip: ClipUniforms, slab: Slab | null, ball: Ball | null): void {
  clip.slabOn.value = slab ? 1 : 0;
  if (slab) {
    clip.slabNormal.value.set(...slab.normal);
    clip.slabLo.value = slab.lo;
    clip.slabHi.value = slab.hi;
  }
  clip.ballOn.value = ball ? 1 : 0;
  if (ball) {
    clip.ballCentre.value.set(...ball.centre);
    clip.ballRadius.value = ball.radius;
  }
}

/** Set one uniform of a material. */
export function setUniform(material: THREE.ShaderMaterial, name: string, value: unknown): void {
  material.uniforms[name].value = value;
}

const CLIP_GLSL = /* glsl */ `
uniform float slabOn;
uniform vec3 slabNormal;
uniform float slabLo;
uniform float slabHi;
uniform float ballOn;
uniform vec3 ballCentre;
uniform float ballRadius;
bool shown(vec3 p) {
  float s = dot(slabNormal, p);
  if (slabOn > 0.5 && (s < slabLo || s > slabHi)) return false;
  vec3 d = p - ballCentre;
  if (ballOn > 0.5 && dot(d, d) > ballRadius * ballRadius) return false;
  return true;
}
`;

const IMPOSTOR_VERTEX = /* glsl */ `
${CLIP_GLSL}
attribute vec3 instanceCentre;
uniform float radius;
varying vec3 vCentre;
varying vec3 vQuad;
void main() {
  if (!shown(instanceCentre)) {
    gl_Position = vec4(2.0, 2.0, 2.0, 1.0);
    return;
  }
  vec3 c = (modelViewMatrix * vec4(instanceCentre, 1.0)).xyz;
  bool ortho = projectionMatrix[2][3] == 0.0;
  vec3 u = vec3(1.0, 0.0, 0.0);
  vec3 v = vec3(0.0, 1.0, 0.0);
  float h = radius;
  if (!ortho) {
    float d2 = dot(c, c);
    if (d2 <= radius * radius * 1.0001) { gl_Position = vec4(2.0, 2.0, 2.0, 1.0); return; }
    vec3 w = normalize(c);
    vec3 ref = abs(w.y) > 0.99 ? vec3(1.0, 0.0, 0.0) : vec3(0.0, 1.0, 0.0);
    u = normalize(cross(w, ref));
    v = cross(u, w);
    h = radius * sqrt(d2) / sqrt(d2 - radius * radius);
  }
  vec3 q = c + (u * position.x + v * position.y) * h;
  vCentre = c;
  vQuad = q;
  gl_Position = projectionMatrix * vec4(q, 1.0);
}
`;

const IMPOSTOR_FRAGMENT = /* glsl */ `
uniform mat4 projectionMatrix;
uniform float radius;
uniform vec3 colour;
uniform float opacity;
varying vec3 vCentre;
varying vec3 vQuad;
void main() {
  bool ortho = projectionMatrix[2][3] == 0.0;
  vec3 p;
  if (ortho) {
    vec2 dxy = vQuad.xy - vCentre.xy;
    float h2 = radius * radius - dot(dxy, dxy);
    if (h2 < 0.0) discard;
    p = vec3(vQuad.xy, vCentre.z + sqrt(h2));
  } else {
    vec3 d = normalize(vQuad);
    float b = dot(d, vCentre);
    float h2 = b * b - dot(vCentre, vCentre) + radius * radius;
    if (h2 < 0.0) discard;
    p = d * (b - sqrt(h2));
  }
  vec3 n = (p - vCentre) / radius;
  vec4 clip = projectionMatrix * vec4(p, 1.0);
  gl_FragDepth = 0.5 * (clip.z / clip.w) + 0.5;

  // Our shading: a soft key light from the upper left, a little sky fill, a dull highlight, and the
  // rim pulled towards ink so packed spheres stay separable in a flat orthographic view.
  vec3 toEye = ortho ? vec3(0.0, 0.0, 1.0) : normalize(-p);
  vec3 key = normalize(vec3(-0.45, 0.6, 0.66));
  float diffuse = max(dot(n, key), 0.0);
  float fill = 0.5 + 0.5 * n.y;
  float spec = pow(max(dot(n, normalize(key + toEye)), 0.0), 48.0);
  float rim = smoothstep(0.55, 1.0, 1.0 - max(dot(n, toEye), 0.0));
  vec3 c = colour * (0.32 + 0.62 * diffuse + 0.12 * fill) + vec3(0.22 * spec);
  c = mix(c, vec3(0.0086, 0.0144, 0.0273), 0.55 * rim);
  gl_FragColor = vec4(c, opacity);
  #include <colorspace_fragment>
}
`;

/** Material for one species: its colour (sRGB hex) and drawn radius (Å). */
export function createImpostorMaterial(clip: ClipUniforms, colourHex: string, radius: number, opacity = 1): THREE.ShaderMaterial {
  return new THREE.ShaderMaterial({
    uniforms: {
      ...clip,
      radius: { value: radius },
      colour: { value: new THREE.Color(colourHex) },
      opacity: { value: opacity },
    },
    vertexShader: IMPOSTOR_VERTEX,
    fragmentShader: IMPOSTOR_FRAGMENT,
    transparent: opacity < 1,
    depthWrite: opacity >= 1,
    // Both windings: which way the quad faces is not what decides what is drawn, the sphere test is.
    side: THREE.DoubleSide,
  });
}

/**
 * The impostor quads of one species. `instanced`: one shared quad (corners at (±1, ±1)) drawn once per
 * atom with the centre as an instanced attribute — the least memory. Otherwise the same attributes
 * written out per vertex (4 corners and 6 indices per atom) in a single ordinary draw: the shader is the
 * same, and software WebGL (SwiftShader, our headless browser tests and benchmark) pays a large fixed cost
 * per instance, so there the written-out form is many times faster (see tests/bench/viewer.bench.ts).
 */
export function createImpostorGeometry(centres: Float32Array, instanced = true): THREE.BufferGeometry {
  const n = centres.length / 3;
  if (instanced) {
    const g = new THREE.InstancedBufferGeometry();
    g.setAttribute('position', new THREE.BufferAttribute(new Float32Array([-1, -1, 0, 1, -1, 0, 1, 1, 0, -1, 1, 0]), 3));
    g.setIndex([0, 1, 2, 0, 2, 3]);
    g.setAttribute('instanceCentre', new THREE.InstancedBufferAttribute(centres, 3));
    g.instanceCount = n;
    return g;
  }
  const corner = new Float32Array(12 * n);
  const centre = new Float32Array(12 * n);
  const index = new Uint32Array(6 * n);
  const quad = [-1, -1, 0, 1, -1, 0, 1, 1, 0, -1, 1, 0];
  for (let i = 0; i < n; i++) {
    corner.set(quad, 12 * i);
    for (let k = 0; k < 4; k++) centre.set(centres.subarray(3 * i, 3 * i + 3), 12 * i + 3 * k);
    index.set([4 * i, 4 * i + 1, 4 * i + 2, 4 * i, 4 * i + 2, 4 * i + 3], 6 * i);
  }
  const g = new THREE.BufferGeometry();
  g.setAttribute('position', new THREE.BufferAttribute(corner, 3));
  g.setAttribute('instanceCentre', new THREE.BufferAttribute(centre, 3));
  g.setIndex(new THREE.BufferAttribute(index, 1));
  return g;
}

const BOND_VERTEX = /* glsl */ `
${CLIP_GLSL}
attribute vec3 bondStart;
attribute vec3 bondEnd;
uniform float bondRadius;
varying vec3 vNormal;
void main() {
  if (!shown(bondStart) || !shown(bondEnd)) {
    gl_Position = vec4(2.0, 2.0, 2.0, 1.0);
    return;
  }
  vec3 axis = bondEnd - bondStart;
  float len = length(axis);
  vec3 w = axis / len;
  vec3 ref = abs(w.y) > 0.99 ? vec3(1.0, 0.0, 0.0) : vec3(0.0, 1.0, 0.0);
  vec3 u = normalize(cross(ref, w));
  vec3 v = cross(w, u);
  vec3 p = bondStart + w * (position.y * len) + (u * position.x + v * position.z) * bondRadius;
  vNormal = normalize(normalMatrix * (u * normal.x + v * normal.z));
  gl_Position = projectionMatrix * modelViewMatrix * vec4(p, 1.0);
}
`;

const BOND_FRAGMENT = /* glsl */ `
uniform vec3 colour;
varying vec3 vNormal;
void main() {
  vec3 key = normalize(vec3(-0.45, 0.6, 0.66));
  float diffuse = abs(dot(normalize(vNormal), key));
  gl_FragColor = vec4(colour * (0.4 + 0.6 * diffuse), 1.0);
  #include <colorspace_fragment>
}
`;

export function createBondMaterial(clip: ClipUniforms, colourHex: string, bondRadius: number): THREE.ShaderMaterial {
  return new THREE.ShaderMaterial({
    uniforms: { ...clip, colour: { value: new THREE.Color(colourHex) }, bondRadius: { value: bondRadius } },
    vertexShader: BOND_VERTEX,
    fragmentShader: BOND_FRAGMENT,
  });
}

/** An open 6-sided tube from y = 0 to y = 1 (12 triangles per bond), instanced by start and end. */
export function createBondGeometry(starts: Float32Array, ends: Float32Array): THREE.InstancedBufferGeometry {
  const tube = new THREE.CylinderGeometry(1, 1, 1, 6, 1, true).translate(0, 0.5, 0);
  const g = new THREE.InstancedBufferGeometry();
  g.setAttribute('position', tube.getAttribute('position'));
  g.setAttribute('normal', tube.getAttribute('normal'));
  g.setIndex(tube.getIndex());
  g.setAttribute('bondStart', new THREE.InstancedBufferAttribute(starts, 3));
  g.setAttribute('bondEnd', new THREE.InstancedBufferAttribute(ends, 3));
  g.instanceCount = starts.length / 3;
  tube.dispose();
  return g;
}
