'use client';
/** What is known about the picked atoms, and the distances and angle between them. */
import type { Structure } from '@/lib/structure/types';
import { toFractional } from '@/lib/math/frac';
import { symbolOf } from '@/lib/structure';
import { formatIndices } from '@/lib/view/axes';
import type { Measurement } from '@/lib/view/measure';
import type { ViewStore } from './store';

const f3 = (x: number) => x.toFixed(3);

export function AtomReadout({ structure, store, measurement }: { structure: Structure; store: ViewStore; measurement: Measurement }) {
  const nearestImage = store((s) => s.nearestImage);
  const setNearestImage = store((s) => s.setNearestImage);
  const picks = measurement.atoms;
  const p = structure.positions;
  if (picks.length === 0) {
    return (
      <p className="rounded-lg border border-rule bg-card px-3 py-2 text-sm text-ink-soft" data-testid="atom-readout" aria-live="polite">
        Click an atom (or focus the view and press Enter) to read it; shift-click adds a second and third for a distance and an angle.
      </p>
    );
  }
  const last = picks.length - 1;
  const moved = (k: number) => measurement.shifts[k].some((x) => x !== 0);
  return (
    // Capped and scrolling, so three picks never squeeze the view above; the table scrolls sideways rather
    // than wrapping its numbers in a narrow window.
    <div className="max-h-36 overflow-auto rounded-lg border border-rule bg-card px-3 py-2 text-sm" data-testid="atom-readout" aria-live="polite">
      <table className="w-full whitespace-nowrap font-mono text-xs [&_td]:pr-3 [&_th]:pr-3">
        <thead className="text-left text-ink-soft">
          <tr>
            <th className="font-medium">atom</th>
            <th className="font-medium">species</th>
            <th className="font-medium">site</th>
            <th className="font-medium">x y z (Å)</th>
            {structure.cell && <th className="font-medium">fractional</th>}
            {structure.perp && <th className="font-medium">perpendicular (Å)</th>}
          </tr>
        </thead>
        <tbody>
          {picks.map((i, k) => {
            const z = structure.species[i];
            const site = structure.site && structure.siteClasses ? structure.siteClasses[structure.site[i]]?.name : undefined;
            const frac = structure.cell ? toFractional(structure.cell, p.subarray(3 * i, 3 * i + 3)) : null;
            const dim = structure.perpDim ?? 3;
            const perp = structure.perp ? Array.from(structure.perp.subarray(dim * i, dim * i + dim)) : null;
            return (
              <tr key={i} className={k === last ? 'text-ink' : 'text-ink-soft'} data-testid="picked-atom">
                <td>#{i}</td>
                <td>
                  {symbolOf(z)}
                  {z ? ` (Z ${z})` : ' (unassigned)'}
                </td>
                <td>{site ?? '—'}</td>
                <td>{[p[3 * i], p[3 * i + 1], p[3 * i + 2]].map(f3).join('  ')}</td>
                {frac && <td>{Array.from(frac).map(f3).join('  ')}</td>}
                {structure.perp && <td>{perp ? perp.map(f3).join('  ') : '—'}</td>}
              </tr>
            );
          })}
        </tbody>
      </table>
      {picks.length >= 2 && (
        <div className="mt-1 flex flex-wrap items-center gap-x-3 gap-y-1 text-xs">
          <p data-testid="measure">
            {measurement.lengths.map((len, k) => (
              <span key={k}>
                {k > 0 ? ' · ' : ''}
                distance #{picks[k]}–#{picks[k + 1]}
                {moved(k + 1) ? ` (image ${formatIndices(measurement.shifts[k + 1])})` : ''}: <b className="font-mono">{len.toFixed(3)} Å</b>
              </span>
            ))}
            {measurement.angle !== null && (
              <>
                {' · '}angle #{picks[0]}–#{picks[1]}–#{picks[2]}: <b className="font-mono">{measurement.angle.toFixed(2)}°</b>
              </>
            )}
          </p>
          {structure.cell && (
            <label className="flex items-center gap-1.5" title="Measure to the periodic image of each atom that is nearest the atom before it (the minimum image), not to the copy inside the drawn cell">
              <input type="checkbox" checked={nearestImage} onChange={(e) => setNearestImage(e.target.checked)} />
              nearest image
            </label>
          )}
        </div>
      )}
    </div>
  );
}
