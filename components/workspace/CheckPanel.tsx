'use client';
/**
 * The Check step in the workspace: a strip under the view tabs after every cut — how many problems, the density
 * in the unit of the model's dimension, the shortest contact — that opens into the full report (distances per
 * species pair against the metallic radii, too-close pairs, coordination per site class, density against the
 * close-packed ideal, composition, atoms outside the cell) and the supercell used by the download menu.
 * The report is shared with the download menu and the save dialog (downloads.ts useExportState), which ask before
 * a cut with a severe problem leaves.
 */
import { useEffect, useMemo, useState } from 'react';
import type { Structure } from '@/lib/structure/types';
import { checkStructure, type CheckReport, type Severity } from '@/lib/structure/checks/report';
import { MAX_SUPERCELL_COPIES, type SupercellSize } from '@/lib/structure/supercell';
import { useExportState } from './downloads';

const TONE: Record<Severity, string> = {
  severe: 'border-clay bg-clay-pale text-clay',
  warning: 'border-brass bg-brass-pale text-ink',
  info: 'border-rule bg-paper text-ink-soft',
};
const WORD: Record<Severity, string> = { severe: 'Severe', warning: 'Warning', info: 'Note' };

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
  const notes = r.warnings.length;
  return { text: `no problems found${notes ? ` · ${notes} note${notes === 1 ? '' : 's'} in the full report` : ''}`, tone: 'ok' };
}

function densityText(r: CheckReport): string | null {
  const d = r.density;
  if (!d) return null;
  const digits = d.unit === 'atoms/Å³' ? 5 : 4;
  return `${d.number.toFixed(digits)} ${d.unit}${d.mass !== undefined && d.mass > 0 ? `, ${d.mass.toFixed(3)} g/cm³` : ''}`;
}

export function CheckPanel({ structure }: { structure: Structure | null }) {
  const { report, error } = useMemo(() => runCheck(structure), [structure]);
  const setReport = useExportState((s) => s.setReport);
  const supercell = useExportState((s) => s.supercell);
  const setSupercell = useExportState((s) => s.setSupercell);
  const [open, setOpen] = useState(false);
  useEffect(() => {
    setReport(report);
  }, [report, setReport]);
  if (!structure) return null;
  if (!report) {
    return (
      <div role="status" className="rounded-lg border border-clay bg-clay-pale px-3 py-1.5 text-xs text-clay">
        Check could not run: {error}
      </div>
    );
  }
  const v = verdict(report);
  const badge = v.tone === 'ok' ? 'border-tide bg-tide-pale text-tide-deep' : TONE[v.tone];
  return (
    <section aria-label="Check" data-testid="check-panel" className="rounded-lg border border-rule bg-card text-xs">
      <div className="flex flex-wrap items-center gap-x-3 gap-y-1 px-3 py-1.5">
        <h2 className="text-sm font-semibold">Check</h2>
        <span className={`rounded border px-1.5 py-0.5 font-medium ${badge}`} data-testid="check-verdict">
          {v.text}
        </span>
        {densityText(report) ? <span className="text-ink-soft">density {densityText(report)}</span> : null}
        {report.density?.ratio !== undefined ? <span className="text-ink-soft">{(100 * report.density.ratio).toFixed(0)} % of close-packed</span> : null}
        {report.shortest !== null ? <span className="text-ink-soft">shortest {report.shortest.toFixed(3)} Å</span> : null}
        {report.spaceGroup ? (
          <span className="text-ink-soft">
            space group {report.spaceGroup.symbol} ({report.spaceGroup.number})
          </span>
        ) : null}
        <button type="button" className="ml-auto rounded-md border border-rule px-2 py-0.5 hover:border-tide hover:text-tide" aria-expanded={open} aria-controls="check-details" onClick={() => setOpen((o) => !o)}>
          {open ? 'Hide report' : 'Full report'}
        </button>
      </div>
      {report.warnings.some((w) => w.severity !== 'info') ? (
        <ul className="space-y-1 px-3 pb-2" aria-label="Check warnings">
          {report.warnings
            .filter((w) => w.severity !== 'info')
            .map((w, k) => (
              <li key={k} className={`rounded border px-2 py-1 ${TONE[w.severity]}`}>
                <span className="font-semibold">{WORD[w.severity]}:</span> {w.message}
              </li>
            ))}
        </ul>
      ) : null}
      {open ? <Details report={report} periodic={!!structure.cell} supercell={supercell} onSupercell={setSupercell} /> : null}
    </section>
  );
}

function Details({ report, periodic, supercell, onSupercell }: { report: CheckReport; periodic: boolean; supercell: SupercellSize; onSupercell: (n: SupercellSize) => void }) {
  const d = report.density;
  return (
    <div id="check-details" className="max-h-72 space-y-3 overflow-y-auto border-t border-rule px-3 py-2">
      <div className="grid gap-x-6 gap-y-1 sm:grid-cols-2">
        <p>
          <span className="text-ink-soft">Atoms</span> {report.atoms.toLocaleString('en-US')}
          {report.periodic ? ` per cell · ${report.outsideCell.toLocaleString('en-US')} outside it` : ''}
        </p>
        <p>
          <span className="text-ink-soft">Composition</span> {report.composition.formula}
        </p>
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
