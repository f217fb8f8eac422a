'use client';
/**
 * The notes the generator left on the current cut (symmetric window position, fractional boundary sites, offsets
 * that lower the symmetry, clusters merged), on one line beside the cut summary so the view keeps its height: the
 * ones that lower the symmetry or leave fractional sites first and in amber; the full list is in the Check details.
 * The space group itself is in the Check strip (CheckPanel.tsx), which runs the finder in the page.
 */
import type { Structure } from '../../lib/structure/types';

const CAUTION = /lowers|off every|fractional/;

export function SpaceGroupFacts({ structure }: { structure: Structure | null }) {
  const notes = [...(structure?.notes ?? [])].sort((a, b) => Number(CAUTION.test(b)) - Number(CAUTION.test(a)));
  if (notes.length === 0) return null;
  const caution = CAUTION.test(notes[0]);
  return (
    <p className={`min-w-0 flex-1 truncate text-xs ${caution ? 'text-amber-700' : 'text-ink/80'}`} title={notes.join('\n')} data-testid="space-group-facts">
      {notes.join(' · ')}
    </p>
  );
}
