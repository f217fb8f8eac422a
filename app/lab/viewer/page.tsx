'use client';
/**
 * Lab page for the viewer (development, benchmark and browser tests):
 *   /lab/viewer?n=1000&shape=icosa|fcc|cell&mode=impostor|instanced|naive
 * Default shape: icosa up to 3000 points, fcc above.
 */
import { useSearchParams } from 'next/navigation';
import { Suspense, useMemo } from 'react';
import { LazyStructureViewer } from '@/components/viewer/LazyStructureViewer';
import { syntheticStructure, type Shape } from './synthetic';

function Lab() {
  const q = useSearchParams();
  const n = Math.max(1, Math.min(300_000, Math.round(Number(q.get('n') ?? 1000)) || 1000));
  const shapeParam = q.get('shape');
  const shape: Shape = shapeParam === 'icosa' || shapeParam === 'fcc' || shapeParam === 'cell' ? shapeParam : n <= 3000 ? 'icosa' : 'fcc';
  const m = q.get('mode');
  const mode = m === 'naive' || m === 'instanced' ? m : 'impostor';
  const structure = useMemo(() => syntheticStructure(shape, n), [shape, n]);
  return (
    <div className="space-y-3">
      <h1 className="text-xl font-semibold tracking-tight">Viewer lab</h1>
      <p className="text-sm text-ink-soft" data-testid="lab-summary">
        {structure.species.length.toLocaleString('en')} points · {shape} · {mode === 'naive' ? 'triangulated spheres (reference)' : mode === 'instanced' ? 'sphere impostors, instanced quad' : 'sphere impostors'}
      </p>
      <LazyStructureViewer structure={structure} drawMode={mode} exposeTestHook className="h-[600px]" />
    </div>
  );
}

export default function ViewerLabPage() {
  return (
    <Suspense fallback={null}>
      <Lab />
    </Suspense>
  );
}
