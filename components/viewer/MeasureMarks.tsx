'use client';
/**
 * The measurement drawn in the scene: a line from each pick to the next with its length beside it, the
 * angle at the middle pick, and — when the nearest image of an atom lies outside the drawn cell — a ghost
 * mark where that image sits, so the line ends on something (the readout names the image's translation;
 * a second label there would crowd the short lines that nearest images give). Lines are drei's Line (screen-space width,
 * drawn over the atoms and after the translucent pick shells, so a measurement through a cluster stays
 * visible and keeps its colour); labels are drei's Html, plain
 * DOM that takes the page's fonts and colours.
 */
import { Html, Line } from '@react-three/drei';
import { useEffect, useMemo } from 'react';
import type { Measurement } from '@/lib/view/measure';
import { createImpostorGeometry, createImpostorMaterial, type ClipUniforms } from './impostorMaterial';

/** Brass from the palette (globals.css --color-brass): the colour of picks and measurements. */
const MEASURE_COLOUR = '#b8862b';

const chip = 'pointer-events-none whitespace-nowrap rounded border border-brass bg-card/95 px-1.5 py-px font-mono text-[11px] leading-4 text-ink shadow-sm';

function GhostMark({ at, radius, clip }: { at: [number, number, number]; radius: number; clip: ClipUniforms }) {
  const [x, y, z] = at;
  const geometry = useMemo(() => createImpostorGeometry(new Float32Array([x, y, z])), [x, y, z]);
  const material = useMemo(() => createImpostorMaterial(clip, MEASURE_COLOUR, radius, 0.3), [clip, radius]);
  useEffect(
    () => () => {
      geometry.dispose();
      material.dispose();
    },
    [geometry, material],
  );
  return <mesh geometry={geometry} material={material} frustumCulled={false} renderOrder={11} name="image-mark" />;
}

export function MeasureMarks({ measurement, radii, clip }: { measurement: Measurement; radii: Float32Array; clip: ClipUniforms }) {
  const { atoms, points, shifts, lengths, angle } = measurement;
  if (points.length < 2) return null;
  return (
    <group name="measurement">
      {lengths.map((len, k) => {
        const a = points[k];
        const b = points[k + 1];
        const mid: [number, number, number] = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2, (a[2] + b[2]) / 2];
        return (
          <group key={k}>
            <Line points={[a, b]} color={MEASURE_COLOUR} lineWidth={2.5} depthTest={false} transparent renderOrder={12} name="measure-line" />
            <Html position={mid} center zIndexRange={[30, 20]}>
              <div className={chip} data-testid="measure-label">
                {len.toFixed(3)} Å
              </div>
            </Html>
          </group>
        );
      })}
      {angle !== null && (
        <Html position={points[1]} center zIndexRange={[30, 20]}>
          <div className={`${chip} -translate-y-5`} data-testid="angle-label">
            {angle.toFixed(1)}°
          </div>
        </Html>
      )}
      {shifts.map((s, k) =>
        s.some((x) => x !== 0) ? (
          <GhostMark key={`image-${k}`} at={points[k]} radius={radii[atoms[k]] * 1.3 + 0.1} clip={clip} />
        ) : null,
      )}
    </group>
  );
}
