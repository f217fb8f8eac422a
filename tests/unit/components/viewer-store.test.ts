import { describe, expect, it } from 'vitest';
import { createViewStore, MAX_PICKS } from '@/components/viewer/store';
import { createImpostorGeometry } from '@/components/viewer/impostorMaterial';

describe('view store', () => {
  it('a plain pick replaces, an extending pick appends, keeping the last three without repeats', () => {
    const s = createViewStore();
    s.getState().pick(4);
    s.getState().pick(7);
    expect(s.getState().picks).toEqual([7]);
    for (const i of [1, 2, 3, 2]) s.getState().pick(i, true);
    expect(s.getState().picks).toEqual([1, 3, 2]);
    expect(s.getState().picks.length).toBe(MAX_PICKS);
    s.getState().clearPicks();
    expect(s.getState().picks).toEqual([]);
  });

  it('snapping to the same axis twice still asks for a snap; patches merge; radius scale is clamped', () => {
    const s = createViewStore();
    const axis = { kind: 'fold', fold: 5, index: 1 } as const;
    s.getState().snapTo(axis);
    s.getState().snapTo(axis);
    expect(s.getState().snapRequest).toBe(2);
    expect(s.getState().axis).toEqual(axis);
    s.getState().setSlab({ on: true });
    expect(s.getState().slab).toMatchObject({ on: true, thickness: 4 });
    s.getState().setRadiusScale(40);
    expect(s.getState().radiusScale).toBe(2);
  });

  it('starts measuring to the nearest image, in the page (not full window), with the controls open', () => {
    const s = createViewStore();
    expect(s.getState()).toMatchObject({ nearestImage: true, fullWindow: false, controlsOpen: true });
    s.getState().setFullWindow(true);
    s.getState().setControlsOpen(false);
    s.getState().setNearestImage(false);
    expect(s.getState()).toMatchObject({ nearestImage: false, fullWindow: true, controlsOpen: false });
  });

  it('separate stores do not share state', () => {
    const a = createViewStore();
    const b = createViewStore();
    a.getState().setCameraMode('orthographic');
    expect(b.getState().cameraMode).toBe('perspective');
  });
});

describe('impostor geometry', () => {
  it('written-out quads carry the same corners and centres as the instanced quad', () => {
    const centres = new Float32Array([1, 2, 3, -4, 5, -6]);
    const inst = createImpostorGeometry(centres, true);
    const flat = createImpostorGeometry(centres, false);
    const quad = inst.getAttribute('position').array;
    const idx = inst.getIndex()!.array;
    const fIdx = flat.getIndex()!.array;
    const fPos = flat.getAttribute('position').array;
    const fCen = flat.getAttribute('instanceCentre').array;
    expect(fIdx.length).toBe(idx.length * 2);
    for (let atom = 0; atom < 2; atom++) {
      for (let k = 0; k < 6; k++) {
        const v = fIdx[6 * atom + k];
        expect(v - 4 * atom).toBe(idx[k]);
        for (let d = 0; d < 3; d++) {
          expect(fPos[3 * v + d]).toBe(quad[3 * idx[k] + d]);
          expect(fCen[3 * v + d]).toBe(centres[3 * atom + d]);
        }
      }
    }
  });
});
