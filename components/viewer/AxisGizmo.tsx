'use client';
/**
 * Which way x, y and z point, in a corner of the view: drei's GizmoHelper and GizmoViewport in our colours
 * and our sans font. It only shows the orientation (clicks go to the structure, not to the gizmo): the
 * axis buttons beside the view are the way to look down a direction. It draws after the structure
 * (priority 2; the Rig draws the structure at 1), so it never costs a second pass over the atoms.
 */
import { GizmoHelper, GizmoViewport } from '@react-three/drei';
import { useEffect, useState } from 'react';

/** clay, tide, brass from globals.css: x, y, z. */
const AXIS_COLOURS: [string, string, string] = ['#b4472f', '#0e6f6a', '#b8862b'];

/** The page's sans family (next/font names it), for the labels drawn on a 2D canvas. */
function usePageFont(): string | null {
  const [font, setFont] = useState<string | null>(null);
  useEffect(() => {
    let live = true;
    const family = getComputedStyle(document.documentElement).getPropertyValue('--font-plex-sans').trim() || 'sans-serif';
    // Draw the labels only once the font is there, or the canvas would bake in a fallback.
    void document.fonts.ready.then(() => live && setFont(`600 20px ${family}, sans-serif`));
    return () => {
      live = false;
    };
  }, []);
  return font;
}

export function AxisGizmo() {
  const font = usePageFont();
  if (!font) return null;
  return (
    <GizmoHelper alignment="bottom-left" margin={[52, 52]} renderPriority={2}>
      <GizmoViewport disabled hideNegativeAxes axisColors={AXIS_COLOURS} labelColor="#fffdf8" font={font} labels={['x', 'y', 'z']} scale={34} />
    </GizmoHelper>
  );
}
