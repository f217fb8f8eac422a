'use client';
/**
 * The Check step in the workspace: one line in the workspace's top bar, beside the downloads it guards, after every
 * cut — the verdict, the first problem (else a note of the cut that lowers its symmetry, else the density and the
 * shortest contact), the space group, and a snap when the cell is nearly but not exactly symmetric — with a
 * "Details" toggle that opens the full report over the view (every warning, distances per
 * species pair against the metallic radii, too-close pairs, coordination per site class, density against the
 * close-packed ideal, composition, the generator's notes, the snap at a chosen tolerance and the supercell used
 * by the download menu). Folded to one line so the 3D view keeps its height.
 * The report is shared with the download menu and the save dialog (downloads.ts useExportState), which ask before
 * a cut with a severe problem leaves.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Structure } from '@/lib/structure/types';
import { checkStructure, withSpaceGroup, type CheckReport, type Severity } from '@/lib/structure/checks/report';
import { MAX_SUPERCELL_COPIES, type SupercellSize } from '@/lib/structure/supercell';
import { initSymmetryAsync, nearSymmetry, SNAP_SYMPREC, spaceGroupOf, symmetrise, SYMMETRY_ATOM_LIMITS, type GroupBrief } from '@/lib/structure/symmetry';
import { exportFile } from '@/lib/formats/write';
import { fileName, saveText, useExportState } from './downloads';

const TONE: Record<Severity, string> = {
  severe: 'border-clay bg-clay-pale text-clay',
  warning: 'border-brass bg-brass-pale text-ink',
  info: 'border-rule bg-paper text-ink-soft',
};
const WORD: Record<Severity, string> = { severe: 'Severe', warning: 'Warning', info: 'Note' };
/** Notes of the cut worth seeing without opening the details: a lowered symmetry, fractional boundary sites. */
const CAUTION = /lowers|off every|fractional/;

function runCheck(s: Structure | null): { report: CheckReport | null; error: string | null } {
  if (!s) return { report: null, error: null };
  try {
    return { report: checkStructure(s), error: null };
  } catch (e) {
    return { report: null, error: (e as Error).message };
  }
}

function verdict(r: CheckReport): { text: string; tone: Severity | 'ok' } {
  const severe = r.warnings.filter((w) => w.severity === 'severe').length;
  const warn = r.warnings.filter((w) => w.severity === 'warning').length;
  if (severe) return { text: `${severe} severe${warn ? `, ${warn} warning${warn === 1 ? '' : 's'}` : ''}`, tone: 'severe' };
  if (warn) return { text: `${warn} warning${warn === 1 ? '' : 's'}`, tone: 'warning' };
  return { text: 'no problems found', tone: 'ok' };
}

function densityText(r: CheckReport): string | null {
  const d = r.density;
  if (!d) return null;
  const digits = d.unit === 'atoms/Å³' ? 5 : 4;
  return `${d.number.toFixed(digits)} ${d.unit}${d.mass !== undefined && d.mass > 0 ? `, ${d.mass.toFixed(3)} g/cm³` : ''}`;
}

/** The space group as the page finds it: moyo (symprec 1e-3 Å) on the page's thread, up to its atom limit. */
type Symmetry =
  | { kind: 'none' }
  | { kind: 'busy' }
  | { kind: 'skipped'; why: string }
  | { kind: 'found'; number: number; symbol: string; near: { strict: GroupBrief; loose: GroupBrief; higher: boolean } | null }
  | { kind: 'failed'; why: string };

function useSymmetry(structure: Structure | null): Symmetry {
  const [result, setResult] = useState<{ of: Structure; state: Symmetry } | null>(null);
  const n = structure?.species.length ?? 0;
  const computable = !!structure?.cell && n > 0 && n <= SYMMETRY_ATOM_LIMITS.page;
  useEffect(() => {
    if (!computable || !structure) return;
    let live = true;
    initSymmetryAsync()
      .then(() => {
        if (!live) return;
        const g = spaceGroupOf(structure);
        setResult({ of: structure, state: g ? { kind: 'found', ...g, near: nearSymmetry(structure) } : { kind: 'failed', why: 'the symmetry finder gave no answer' } });
      })
      .catch((e: unknown) => {
        if (live) setResult({ of: structure, state: { kind: 'failed', why: `the symmetry finder did not load (${e instanceof Error ? e.message : String(e)})` } });
      });
    return () => {
      live = false;
    };
  }, [structure, computable]);
  if (!structure?.cell || n === 0) return { kind: 'none' };
  if (!computable) return { kind: 'skipped', why: `not computed in the page above ${SYMMETRY_ATOM_LIMITS.page.toLocaleString('en-US')} atoms (CLI: tauforge check)` };
  return result?.of === structure ? result.state : { kind: 'busy' };
}

function spaceGroupText(sym: Symmetry): string | null {
  switch (sym.kind) {
    case 'found':
      return `${sym.symbol} (No. ${sym.number})`;
    case 'busy':
      return 'finding…';
    case 'skipped':
    case 'failed':
      return sym.why;
    default:
      return null;
  }
}

export function CheckPanel({ structure }: { structure: Structure | null }) {
  const base = useMemo(() => runCheck(structure), [structure]);
  const sym = useSymmetry(structure);
  const report = useMemo(() => {
    if (!base.report) return null;
    if (sym.kind === 'found') return withSpaceGroup(base.report, { number: sym.number, symbol: sym.symbol });
    if (sym.kind === 'failed') return withSpaceGroup(base.report, null);
    if (sym.kind === 'skipped') return { ...base.report, spaceGroupNote: sym.why };
    return base.report;
  }, [base.report, sym]);
  const setReport = useExportState((s) => s.setReport);
  const supercell = useExportState((s) => s.supercell);
  const setSupercell = useExportState((s) => s.setSupercell);
  const [open, setOpen] = useState(false);
  const [snapMsg, setSnapMsg] = useState<{ of: Structure; text: string; error?: boolean } | null>(null);
  useEffect(() => {
    setReport(report);
  }, [report, setReport]);
  if (!structure) return null;
  if (!report) {
    return (
      <div role="status" className="min-w-0 flex-1 truncate rounded border border-clay bg-clay-pale px-2 py-0.5 text-xs text-clay" title={base.error ?? undefined}>
        Check could not run: {base.error}
      </div>
    );
  }
  const v = verdict(report);
  const badge = v.tone === 'ok' ? 'border-tide bg-tide-pale text-tide-deep' : TONE[v.tone];
  const first = report.warnings.find((w) => w.severity !== 'info');
  const caution = (structure.notes ?? []).find((n) => CAUTION.test(n));
  const sg = spaceGroupText(sym);
  const near = sym.kind === 'found' ? sym.near : null;
  const snap = (symprec: number) => {
    try {
      const out = symmetrise(structure, { symprec });
      const g = out.spaceGroup;
      const text = exportFile(out.structure, 'cif', { cifSymmetry: 'found', symmetryMaxAtoms: SYMMETRY_ATOM_LIMITS.page }).text;
      saveText(text, fileName(`snapped ${g.hmSymbol}`, 'cif'), 'chemical/x-cif');
      setSnapMsg({ of: structure, text: `Snapped to ${g.hmSymbol} (No. ${g.number}) at ${symprec} Å: largest move ${out.maxShift.toFixed(4)} Å; the CIF was downloaded.` });
    } catch (e) {
      setSnapMsg({ of: structure, text: `Could not snap: ${(e as Error).message}`, error: true });
    }
  };
  const msg = snapMsg?.of === structure ? snapMsg : null;
  return (
    <section aria-label="Check" data-testid="check-panel" className="relative min-w-0 flex-1 text-xs">
      <div className="flex items-center gap-x-3 border-l border-rule pl-3">
        <h2 className="text-sm font-semibold">Check</h2>
        <span className={`shrink-0 rounded border px-1.5 py-0.5 font-medium ${badge}`} data-testid="check-verdict">
          {v.text}
        </span>
        {msg ? (
          <span role="status" className={`min-w-0 flex-1 truncate ${msg.error ? 'text-clay' : 'text-ink'}`} title={msg.text} data-testid="check-snap-result">
            {msg.text}
          </span>
        ) : (
          <span
            className={`min-w-0 flex-1 truncate ${first ? (first.severity === 'severe' ? 'text-clay' : 'text-ink') : caution ? 'text-amber-700' : 'text-ink-soft'}`}
            title={first?.message ?? caution}
            data-testid="check-headline"
          >
            {first
              ? first.message
              : caution
                ? caution
                : [densityText(report) ? `density ${densityText(report)}` : null, report.density?.ratio !== undefined ? `${(100 * report.density.ratio).toFixed(0)} % of close-packed` : null, report.shortest !== null ? `shortest ${report.shortest.toFixed(3)} Å` : null]
                    .filter(Boolean)
                    .join(' · ')}
          </span>
        )}
        {sg ? (
          <span className="shrink-0 text-ink-soft" data-testid="check-space-group" title={sym.kind === 'found' ? 'moyo, symprec 1e-3 Å' : undefined}>
            space group <span className={sym.kind === 'found' ? 'font-medium text-ink' : undefined}>{sg}</span>
          </span>
        ) : null}
        {near?.higher ? (
          <button
            type="button"
            className="shrink-0 rounded-md border border-brass bg-brass-pale px-2 py-0.5 hover:border-tide"
            title={`At ${SNAP_SYMPREC} Å the cell is ${near.loose.symbol} (${near.loose.order} operations) rather than ${near.strict.symbol} (${near.strict.order}): move every atom to the average of its images and download the CIF`}
            onClick={() => snap(SNAP_SYMPREC)}
          >
            Snap to {near.loose.symbol}
          </button>
        ) : null}
        <button type="button" className="shrink-0 rounded-md border border-rule px-2 py-0.5 hover:border-tide hover:text-tide" aria-expanded={open} aria-controls="check-details" onClick={() => setOpen((o) => !o)}>
          {open ? 'Hide details' : 'Details'}
        </button>
      </div>
      {open ? (
        <div className="absolute left-0 top-full z-20 mt-2 w-[min(56rem,calc(100vw-3rem))] rounded-lg border border-rule bg-card shadow-lg">
          <Details report={report} structure={structure} sym={sym} onSnap={snap} supercell={supercell} onSupercell={setSupercell} />
        </div>
      ) : null}
    </section>
  );
}

function Details({ report, structure, sym, onSnap, supercell, onSupercell }: { report: CheckReport; structure: Structure; sym: Symmetry; onSnap: (symprec: number) => void; supercell: SupercellSize; onSupercell: (n: SupercellSize) => void }) {
  const d = report.density;
  const periodic = !!structure.cell;
  const notes = structure.notes ?? [];
  return (
    <div id="check-details" className="max-h-[min(28rem,60vh)] space-y-3 overflow-y-auto px-3 py-2">
      {report.warnings.some((w) => w.severity !== 'info') ? (
        <ul className="space-y-1" aria-label="Check warnings">
          {report.warnings
            .filter((w) => w.severity !== 'info')
            .map((w, k) => (
              <li key={k} className={`rounded border px-2 py-1 ${TONE[w.severity]}`}>
                <span className="font-semibold">{WORD[w.severity]}:</span> {w.message}
              </li>
            ))}
        </ul>
      ) : null}
      <div className="grid gap-x-6 gap-y-1 sm:grid-cols-2">
        <p>
          <span className="text-ink-soft">Atoms</span> {report.atoms.toLocaleString('en-US')}
          {report.periodic ? ` per cell · ${report.outsideCell.toLocaleString('en-US')} outside it` : ''}
        </p>
        <p>
          <span className="text-ink-soft">Composition</span> {report.composition.formula}
        </p>
        {periodic ? (
          <p className="sm:col-span-2">
            <span className="text-ink-soft">Space group</span> {spaceGroupText(sym) ?? '—'}
            {sym.kind === 'found' ? ' · moyo, symprec 1e-3 Å' : ''}
          </p>
        ) : null}
        {d ? (
          <p className="sm:col-span-2">
            <span className="text-ink-soft">Density</span> {densityText(report)} over the {d.region}
            {d.idealNumber !== undefined ? ` · close-packed ideal ${d.idealNumber.toFixed(5)} atoms/Å³ (${d.idealMass!.toFixed(3)} g/cm³), plausible 80–120 %` : ''}
          </p>
        ) : null}
      </div>
      {report.warnings.some((w) => w.severity === 'info') ? (
        <ul className="space-y-1">
          {report.warnings
            .filter((w) => w.severity === 'info')
            .map((w, k) => (
              <li key={k} className={`rounded border px-2 py-1 ${TONE.info}`}>
                {w.message}
              </li>
            ))}
        </ul>
      ) : null}
      <table className="w-full text-left">
        <caption className="text-left font-semibold">Shortest distance per pair (limit {Math.round(100 * report.tooCloseFraction)} % of the sum of CN-12 metallic radii)</caption>
        <thead className="text-ink-soft">
          <tr>
            <th className="pr-3 font-medium">Pair</th>
            <th className="pr-3 text-right font-medium">Shortest (Å)</th>
            <th className="pr-3 text-right font-medium">Limit (Å)</th>
            <th className="text-right font-medium">Too close</th>
          </tr>
        </thead>
        <tbody className="font-mono">
          {report.pairs.map((p) => (
            <tr key={`${p.za}-${p.zb}`} className={p.tooClose ? 'text-clay' : undefined}>
              <td className="pr-3 font-sans">
                {p.a}–{p.b}
              </td>
              <td className="pr-3 text-right">{p.shortest === null ? '—' : p.shortest.toFixed(3)}</td>
              <td className="pr-3 text-right">{p.threshold === null ? 'no radius' : p.threshold.toFixed(3)}</td>
              <td className="text-right">{p.tooClose.toLocaleString('en-US')}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {report.tooClose.length ? (
        <div>
          <p className="font-semibold">
            Closest pairs ({report.tooClose.length} of {report.tooCloseCount.toLocaleString('en-US')})
          </p>
          <p className="font-mono text-clay">
            {report.tooClose
              .slice(0, 12)
              .map((p) => `${p.a}${p.i + 1}–${p.b}${p.j + 1} ${p.distance.toFixed(3)} Å`)
              .join(' · ')}
          </p>
        </div>
      ) : null}
      <table className="w-full text-left">
        <caption className="text-left font-semibold">Coordination (neighbours within {report.coordinationFactor}·(r₁ + r₂))</caption>
        <thead className="text-ink-soft">
          <tr>
            <th className="pr-3 font-medium">Site class</th>
            <th className="pr-3 text-right font-medium">Atoms</th>
            <th className="pr-3 text-right font-medium">Mean</th>
            <th className="text-right font-medium">Range</th>
          </tr>
        </thead>
        <tbody className="font-mono">
          {report.coordination.map((c) => (
            <tr key={c.name}>
              <td className="pr-3 font-sans">{c.name}</td>
              <td className="pr-3 text-right">{c.atoms.toLocaleString('en-US')}</td>
              <td className="pr-3 text-right">{c.mean.toFixed(2)}</td>
              <td className="text-right">
                {c.min}–{c.max}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {notes.length ? (
        <ul className="space-y-0.5" aria-label="Notes from the cut">
          {notes.map((n, i) => (
            <li key={i} className={CAUTION.test(n) ? 'text-amber-700' : 'text-ink-soft'}>
              {n}
            </li>
          ))}
        </ul>
      ) : null}
      {periodic && sym.kind === 'found' ? <SnapField near={sym.near} onSnap={onSnap} /> : null}
      {periodic ? <SupercellField value={supercell} onChange={onSupercell} /> : null}
    </div>
  );
}

/** The supercell every download of a periodic cut uses (n₁ × n₂ × n₃, at most MAX_SUPERCELL_COPIES cells). */
function SupercellField({ value, onChange }: { value: SupercellSize; onChange: (n: SupercellSize) => void }) {
  const copies = value[0] * value[1] * value[2];
  return (
    <fieldset className="flex flex-wrap items-center gap-1">
      <legend className="mb-1 font-semibold">Supercell for downloads</legend>
      {[0, 1, 2].map((k) => (
        <span key={k} className="flex items-center gap-1">
          {k > 0 ? <span aria-hidden="true">×</span> : null}
          <label className="sr-only" htmlFor={`supercell-${k}`}>
            Repeats along {'abc'[k]}
          </label>
          <input
            id={`supercell-${k}`}
            type="number"
            min={1}
            max={10}
            step={1}
            value={value[k]}
            className="w-14 rounded-md border border-rule bg-paper px-1.5 py-0.5"
            onChange={(e) => {
              const v = Math.max(1, Math.min(10, Math.round(Number(e.target.value) || 1)));
              const next = [...value] as SupercellSize;
              next[k] = v;
              if (next[0] * next[1] * next[2] <= MAX_SUPERCELL_COPIES) onChange(next);
            }}
          />
        </span>
      ))}
      <span className="ml-2 text-ink-soft">{copies === 1 ? 'one cell' : `${copies} cells in every downloaded file, wrapped into [0, 1)`}</span>
    </fieldset>
  );
}

/** Snap on request: at a chosen tolerance, every atom moved to the average of its images; the CIF is downloaded. */
function SnapField({ near, onSnap }: { near: { strict: GroupBrief; loose: GroupBrief; higher: boolean } | null; onSnap: (symprec: number) => void }) {
  const [text, setText] = useState(String(SNAP_SYMPREC));
  const value = Number(text);
  const bad = !(value > 0 && value <= 1);
  return (
    <fieldset className="flex flex-wrap items-center gap-2">
      <legend className="mb-1 font-semibold">Snap to a space group</legend>
      <label htmlFor="snap-symprec" className="text-ink-soft">
        Tolerance (Å)
      </label>
      <input id="snap-symprec" type="number" min={0.0001} max={1} step={0.001} value={text} onChange={(e) => setText(e.target.value)} className="w-24 rounded-md border border-rule bg-paper px-1.5 py-0.5" aria-invalid={bad} />
      <button type="button" disabled={bad} className="rounded-md border border-rule px-2 py-0.5 hover:border-tide disabled:opacity-40" onClick={() => onSnap(value)}>
        Snap and download CIF
      </button>
      <span className="text-ink-soft">
        {bad
          ? 'a length above 0 and at most 1 Å'
          : near
            ? near.higher
              ? `at ${SNAP_SYMPREC} Å the cell is ${near.loose.symbol} (${near.loose.order} operations), strictly ${near.strict.symbol} (${near.strict.order})`
              : `the cell is exactly ${near.strict.symbol} at 1e-3 Å and at ${SNAP_SYMPREC} Å`
            : ''}
      </span>
    </fieldset>
  );
}
