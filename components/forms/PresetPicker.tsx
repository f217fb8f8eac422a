'use client';
/**
 * Above an icosahedral model's fields: pick a cluster preset and put it on the site it is meant for. The panel
 * says first what the preset brings (site classes, cluster, species per shell, a_R) and what it replaces; the
 * button fills the decoration (preset-site.ts) and, if ticked, a_R; Undo brings the previous model back. Every
 * field it fills stays editable in the form below.
 */
import { useId, useState } from 'react';
import { CLUSTER_PRESETS } from '@/lib/models/icosahedral/clusters';
import type { Params } from './families';
import { PRESET_NAMES, presetOffSite, presetPlan, withPresetOnSite, type PresetName } from './preset-site';

const selectCls = 'w-full rounded-md border border-rule bg-card px-2 py-1 text-sm';

/** "Tsai — YbCd6": the cluster and the compound it is modelled on (the plan below gives the atoms and shells). */
function label(p: PresetName): string {
  const t = CLUSTER_PRESETS[p];
  return t.phase ? `${t.name} — ${t.phase.name.replace(/\s*\([^()]*\)$/, '')}` : t.name;
}

export function PresetPicker({ params, onChange }: { params: Params; onChange: (p: Params) => void }) {
  const id = useId();
  // null until the user picks in this list ('' = picked none).
  const [chosen, setChosen] = useState<PresetName | '' | null>(null);
  // A preset the model already uses off its site (picked in a cluster below) is offered until another is chosen.
  const offSite = presetOffSite(params);
  const preset: PresetName | '' = chosen ?? offSite?.preset ?? '';
  const [setAR, setSetAR] = useState(true);
  // The model before the last "Put on its site", while it is still the one shown.
  const [undo, setUndo] = useState<{ before: Params; after: Params; preset: PresetName } | null>(null);
  const applied = undo && undo.after === params && undo.preset === preset ? undo : null;
  const plan = preset ? presetPlan(params, preset) : null;
  const sameAR = plan && plan.aR.current !== undefined && Math.abs(plan.aR.current - plan.aR.suggested) < 5e-4;
  const nClasses = plan?.replaces.classes.length ?? 0;

  return (
    <section aria-labelledby={`${id}-h`} className="rounded-md border border-rule bg-paper/60 p-2 text-xs">
      <h3 id={`${id}-h`} className="text-xs font-semibold text-ink">
        <label htmlFor={`${id}-sel`}>Decorate with a cluster preset</label>
      </h3>
      <select id={`${id}-sel`} className={`mt-1 ${selectCls}`} value={preset} onChange={(e) => setChosen(e.target.value as PresetName | '')}>
        <option value="">— choose a preset to put on its site —</option>
        {PRESET_NAMES.map((p) => (
          <option key={p} value={p}>
            {label(p)}
          </option>
        ))}
      </select>
      {plan && preset && !applied ? (
        <div className="mt-1.5 space-y-1 text-ink-soft" data-testid="preset-plan">
          {chosen === null && offSite ? (
            <p className="text-ink">
              Cluster {offSite.cluster + 1} puts the {CLUSTER_PRESETS[offSite.preset].name} preset on “{offSite.at}”, not on the site it is meant for.
            </p>
          ) : null}
          <p>Puts in the decoration these site classes:</p>
          <ul className="ml-4 list-disc">
            {plan.classes.map((c) => (
              <li key={c}>{c}</li>
            ))}
          </ul>
          <p>
            and the cluster on “{CLUSTER_PRESETS[preset].site!.name}”: {plan.cluster}.
          </p>
          {nClasses > 0 ? (
            <p className="rounded border border-brass bg-brass-pale px-1.5 py-1 text-ink">
              Replaces the decoration’s {nClasses} site class{nClasses === 1 ? '' : 'es'} ({plan.replaces.classes.map((n) => `“${n}”`).join(', ')})
              {plan.replaces.clusters ? ` and ${plan.replaces.clusters} cluster placement${plan.replaces.clusters === 1 ? '' : 's'}` : ''}; the merge tolerance is kept. Undo brings them back.
            </p>
          ) : null}
          <label className="flex items-center gap-2 text-ink">
            <input type="checkbox" className="accent-tide" checked={setAR} onChange={(e) => setSetAR(e.target.checked)} />
            Set a_R to {plan.aR.suggested.toFixed(3)} Å, the size the preset is meant for
            {plan.aR.current !== undefined && !sameAR ? ` (now ${plan.aR.current} Å)` : sameAR ? ' (already)' : ''}
          </label>
          {!setAR && !sameAR ? <p className="text-clay">At another a_R neighbouring clusters do not share their atoms: expect close pairs.</p> : null}
          <button
            type="button"
            className="rounded-md border border-tide bg-card px-2 py-0.5 text-xs font-medium text-tide hover:bg-tide-pale"
            onClick={() => {
              const next = withPresetOnSite(params, preset, setAR);
              setUndo({ before: params, after: next, preset });
              setChosen(preset);
              onChange(next);
            }}
          >
            Put {CLUSTER_PRESETS[preset].name} on its site
          </button>
        </div>
      ) : null}
      {applied ? (
        <p role="status" className="mt-1.5 flex flex-wrap items-center gap-2 rounded border border-tide bg-tide-pale px-1.5 py-1 text-tide-deep">
          <span>
            {CLUSTER_PRESETS[applied.preset].name} put on its site{applied.after.aR !== applied.before.aR ? `, a_R = ${String(applied.after.aR)} Å` : ''}. Every field is in the decoration below to edit.
          </span>
          <button type="button" className="rounded border border-tide px-1.5 hover:bg-card" onClick={() => onChange(applied.before)}>
            Undo
          </button>
        </p>
      ) : null}
    </section>
  );
}
