'use client';
/** The series: approximants 1/1 … 21/13 of the current model, one click to cut any of them. */
import type { SeriesRow } from '@/lib/worker/protocol';
import { csv, saveText } from '@/components/workspace/downloads';

export function SeriesTable({ rows, quasicrystalDensity, current, onPick, fileBase }: { rows: SeriesRow[]; quasicrystalDensity?: number; current?: string; onPick: (order: string) => void; fileBase: string }) {
  return (
    <div className="space-y-2">
      <div className="flex items-center gap-3 text-xs text-ink-soft">
        <span>
          Quasicrystal model density: {quasicrystalDensity !== undefined ? `${quasicrystalDensity.toFixed(6)} atoms/Å³` : '—'}. Strain is the phason strain s = (qτ − p)/(pτ + q); misfit is the
          density difference from the quasicrystal.
        </span>
        <button
          type="button"
          className="ml-auto shrink-0 rounded border border-rule px-2 py-0.5 hover:border-tide"
          onClick={() =>
            saveText(
              csv([
                ['order', 'a_A', 'atoms_per_cell', 'number_density_per_A3', 'mass_density_g_cm3', 'composition', 'phason_strain', 'density_misfit', 'counted'],
                ...rows.map((r) => [`${r.p}/${r.q}`, r.a, r.atoms, r.numberDensity, r.massDensity, r.formula, r.strain, r.densityMisfit, r.exact ? 'cut' : 'estimate']),
              ]),
              `${fileBase}-series.csv`,
              'text/csv',
            )
          }
        >
          CSV
        </button>
      </div>
      <table className="w-full rounded-md border border-rule bg-card text-sm [&_td]:whitespace-nowrap">
        <thead>
          <tr className="text-left text-xs text-ink-soft">
            <th className="px-2 py-1 font-medium">Order</th>
            <th className="px-2 py-1 text-right font-medium">a (Å)</th>
            <th className="px-2 py-1 text-right font-medium">Atoms per cell</th>
            <th className="px-2 py-1 text-right font-medium">Density (atoms/Å³)</th>
            <th className="px-2 py-1 text-right font-medium">Mass density (g/cm³)</th>
            <th className="px-2 py-1 font-medium">Composition</th>
            <th className="px-2 py-1 text-right font-medium">Phason strain</th>
            <th className="px-2 py-1 text-right font-medium">Density misfit</th>
            <th className="px-2 py-1" />
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => {
            const order = `${r.p}/${r.q}`;
            return (
              <tr key={order} className={`border-t border-rule ${current === order ? 'bg-tide-pale/60' : ''}`}>
                <td className="px-2 py-1 font-mono">{order}</td>
                <td className="px-2 py-1 text-right font-mono">{r.a.toFixed(3)}</td>
                <td className="px-2 py-1 text-right font-mono">
                  {r.atoms.toLocaleString('en-US')}
                  {r.exact ? '' : ' ≈'}
                </td>
                <td className="px-2 py-1 text-right font-mono">{r.numberDensity.toFixed(6)}</td>
                <td className="px-2 py-1 text-right font-mono">{r.massDensity ? r.massDensity.toFixed(3) : '—'}</td>
                <td className="px-2 py-1 text-xs">{r.formula}</td>
                <td className="px-2 py-1 text-right font-mono">{r.strain.toFixed(5)}</td>
                <td className="px-2 py-1 text-right font-mono">{r.densityMisfit !== undefined ? `${(100 * r.densityMisfit).toFixed(3)} %` : '—'}</td>
                <td className="px-2 py-1 text-right">
                  <button type="button" className="rounded border border-tide px-2 py-0.5 text-xs text-tide hover:bg-tide-pale" onClick={() => onPick(order)} aria-label={`Cut the ${order} approximant`}>
                    Cut {order}
                  </button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
