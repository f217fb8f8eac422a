/** Frame timing for the benchmark: k renders, each forced to finish by a 1-pixel read-back. */
import type * as THREE from 'three';

export function renderTimed(gl: THREE.WebGLRenderer, scene: THREE.Scene, camera: THREE.Camera, k: number) {
  const ctx = gl.getContext();
  const px = new Uint8Array(4);
  const info = gl.info;
  const auto = info.autoReset;
  info.autoReset = false;
  let triangles = 0;
  let calls = 0;
  // One warm-up frame (shader compile, buffer upload) outside the timing.
  gl.render(scene, camera);
  ctx.readPixels(0, 0, 1, 1, ctx.RGBA, ctx.UNSIGNED_BYTE, px);
  const t0 = performance.now();
  for (let f = 0; f < k; f++) {
    info.reset();
    gl.render(scene, camera);
    ctx.readPixels(0, 0, 1, 1, ctx.RGBA, ctx.UNSIGNED_BYTE, px);
    triangles = info.render.triangles;
    calls = info.render.calls;
  }
  const msPerFrame = (performance.now() - t0) / Math.max(1, k);
  info.autoReset = auto;
  return { msPerFrame, triangles, calls };
}
