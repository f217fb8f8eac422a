'use client';
/**
 * The space group of the current periodic cut (moyo, symprec 1e-3 Å) and the notes the generator left
 * (symmetric window position, fractional boundary sites, offsets that lower the symmetry, clusters merged).
 * Shown next to the cut summary; runs after each cut, in the page, for cells up to MAX_ATOMS
 * (larger cells: the CLI).
 */
import { useEffect, useState } from 'react';
import type { Structure } from '../../lib/structure/types';
import { initSymmetryAsync, spaceGroupOf } from '../../lib/structure/symmetry';

// moyo runs on the page's thread: ~1 s for 2 500 atoms, ~5 s for 4 900, ~90 s for 10 000 (measured in Node).
const MAX_ATOMS = 3_000;

type State = { kind: 'none' } | { kind: 'busy' } | { kind: 'found'; number: number; symbol: string } | { kind: 'failed'; why: string };

function computable(s: Structure | null): s is Structure {
  return !!s?.cell && s.species.length > 0 && s.species.length <= MAX_ATOMS;
}

export function SpaceGroupFacts({ structure }: { structure: Structure | null }) {
  const [result, setResult] = useState<{ of: Structure; state: State } | null>(null);
  useEffect(() => {
    if (!computable(structure)) return;
    let live = true;
    initSymmetryAsync()
      .then(() => {
        if (!live) return;
        const g = spaceGroupOf(structure);
        setResult({ of: structure, state: g ? { kind: 'found', ...g } : { kind: 'failed', why: 'the symmetry finder gave no answer' } });
      })
      .catch((e: unknown) => {
        if (live) setResult({ of: structure, state: { kind: 'failed', why: `symmetry finder did not load (${e instanceof Error ? e.message : String(e)})` } });
      });
    return () => {
      live = false;
    };
  }, [structure]);
  const state: State = !structure?.cell || structure.species.length === 0
    ? { kind: 'none' }
    : structure.species.length > MAX_ATOMS
      ? { kind: 'failed', why: `not computed in the page above ${MAX_ATOMS.toLocaleString('en-US')} atoms (the CLI approximant command prints it)` }
      : result?.of === structure
        ? result.state
        : { kind: 'busy' };
  const notes = structure?.notes ?? [];
  if (state.kind === 'none' && notes.length === 0) return null;
  return (
    <div className="flex w-full flex-col gap-0.5 text-xs text-ink/80" data-testid="space-group-facts">
      {state.kind === 'found' ? (
        <span>
          Space group <span className="font-medium text-ink">{state.symbol}</span> (No. {state.number})
        </span>
      ) : state.kind === 'busy' ? (
        <span>Space group: finding…</span>
      ) : state.kind === 'failed' ? (
        <span>Space group: {state.why}</span>
      ) : null}
      {notes.map((n, i) => (
        <span key={i} className={/lowers|off every|fractional/.test(n) ? 'text-amber-700' : undefined}>
          {n}
        </span>
      ))}
    </div>
  );
}
