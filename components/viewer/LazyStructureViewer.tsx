'use client';
/** The viewer without server rendering (WebGL needs a browser): import this one from pages. */
import dynamic from 'next/dynamic';

export const LazyStructureViewer = dynamic(() => import('./StructureViewer'), {
  ssr: false,
  loading: () => <div className="grid h-[640px] place-items-center rounded-lg border border-rule bg-card text-sm text-ink-soft">Preparing the view…</div>,
});

export default LazyStructureViewer;
