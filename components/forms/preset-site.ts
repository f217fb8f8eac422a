/**
 * Putting a cluster preset on the site it is meant for, in the model form: the decoration the preset comes with
 * (lib/models/icosahedral/decorate.ts presetDecoration — its cluster-centre class, its companion classes, the
 * cluster placement) with the preset's usual species spelt out shell by shell where that changes nothing, and the
 * a_R the preset is sized for. The form keeps every field editable afterwards; what it replaces is said first.
 */
import { CLUSTER_PRESET_NAMES, type DecorationParams } from '@/lib/models/icosahedral/decoration-schema';
import { presetDecoration } from '@/lib/models/icosahedral/decorate';
import { CLUSTER_PRESETS, clusterSize, type ClusterTemplate, type PresetPosition } from '@/lib/models/icosahedral/clusters';
import { symbolOf as elementSymbol } from '@/lib/structure/elements';
import type { Params } from './families';

export type PresetName = (typeof CLUSTER_PRESET_NAMES)[number];
export const PRESET_NAMES = CLUSTER_PRESET_NAMES;

/** The a_R a preset is sized for, to the thousandth of an Å (what the form shows and the cut uses). */
export function presetAR(preset: PresetName): number {
  return Number(CLUSTER_PRESETS[preset].aR!.toFixed(3));
}

/** A shell's species in words: "Cd", or "Al 50 % / Zn 50 %" for a mixed shell. */
function shellSpecies(s: ClusterTemplate['shells'][number]): string {
  if (!s.mix) return elementSymbol(s.species);
  return Object.entries(s.mix)
    .map(([z, f]) => `${elementSymbol(Number(z))} ${Math.round(f * 100)} %`)
    .join(' / ');
}

/** The preset's usual species, inside out, as the form's "Species per shell" — only when no shell is mixed or partly occupied (the field would drop that). */
export function usualSpecies(preset: PresetName): string[] | undefined {
  const t = CLUSTER_PRESETS[preset];
  if (t.centre || t.shells.some((s) => s.mix || s.occupancy !== undefined)) return undefined;
  return t.shells.map((s) => elementSymbol(s.species));
}

/**
 * Window scalings as the form shows them: six decimals (1/τ² = 0.381966, 1/τ = 0.618034) rather than seventeen
 * digits. The change is below 1e-6 of the window; the test checks that no vertex crosses its boundary for it.
 */
export function formScale(x: number): number {
  return Number(x.toFixed(6));
}

/** The decoration the form fills in: presetDecoration, with the usual species spelt out when that is exact. */
export function presetFormDecoration(preset: PresetName): DecorationParams {
  const d = presetDecoration(preset);
  const species = usualSpecies(preset);
  return {
    ...d,
    classes: d.classes.map((c) => (c.window.kind === 'hypercube' ? { ...c, window: { ...c.window, scale: formScale(c.window.scale) } } : c)),
    clusters: species ? d.clusters!.map((c) => ({ ...c, species })) : d.clusters,
  };
}

/** What putting the preset on its site does, in lines a modeller reads before pressing the button. */
export interface PresetPlan {
  /** One line per site class the preset brings. */
  classes: string[];
  /** The cluster: name, atoms, shells with their species. */
  cluster: string;
  /** The a_R the preset is sized for and whether the cut has it now. */
  aR: { suggested: number; current?: number };
  /** Names of the site classes and the number of clusters now in the decoration, which will be replaced. */
  replaces: { classes: string[]; clusters: number };
}

const TAU = (1 + Math.sqrt(5)) / 2;
const NAMED_SCALES: [number, string][] = [
  [1, '1'],
  [1 / TAU, '1/τ ≈ 0.618'],
  [1 / (TAU * TAU), '1/τ² ≈ 0.382'],
];

function windowWords(scale: number): string {
  const named = NAMED_SCALES.find(([x]) => Math.abs(x - scale) < 1e-6);
  return `triacontahedral window × ${named ? named[1] : scale.toFixed(3)}`;
}

const POSITION: Record<string, string> = { node: 'node', body: 'body centre' };
const SUBSCRIPT = '₀₁₂₃₄₅₆₇₈₉';

/** A preset class's 6D position in words: node, body centre, ½(1,…,1) − ½eₖ, or the six numbers. */
function positionWords(p: PresetPosition): string {
  if (typeof p === 'string') return POSITION[p] ?? p;
  const zero = p.findIndex((x) => x === 0);
  if (p.filter((x) => x === 0).length === 1 && p.every((x, i) => i === zero || x === 0.5)) return `½(1,…,1) − ½e${SUBSCRIPT[zero + 1]}`;
  return `(${p.join(', ')})`;
}

export function presetPlan(params: Params, preset: PresetName): PresetPlan {
  const t = CLUSTER_PRESETS[preset];
  const site = t.site!;
  const deco = params.decoration as Partial<DecorationParams> | undefined;
  const existing = Array.isArray(deco?.classes) ? deco.classes : [];
  return {
    classes: [
      `“${site.name}”: cluster centres, ${positionWords(site.position)}, ${windowWords(site.windowScale)}`,
      ...(t.companions ?? []).map((c) => `“${c.name}”: ${c.species}, ${positionWords(c.position)}, ${windowWords(c.windowScale)}`),
    ],
    cluster: `${t.name}, ${clusterSize(t)} atoms: ${t.shells.map((s) => `${s.name} (${shellSpecies(s)})`).join(', ')}`,
    aR: { suggested: presetAR(preset), current: typeof params.aR === 'number' ? params.aR : undefined },
    replaces: {
      classes: existing.map((c, i) => (c && typeof c.name === 'string' && c.name ? c.name : `class ${i + 1}`)),
      clusters: Array.isArray(deco?.clusters) ? deco.clusters.length : 0,
    },
  };
}

/**
 * The params with the preset on its site: the decoration replaced by the preset's (the merge tolerance the user
 * set is kept), and a_R set to the preset's when `setAR`. Nothing else changes.
 */
export function withPresetOnSite(params: Params, preset: PresetName, setAR: boolean): Params {
  const deco = params.decoration as Partial<DecorationParams> | undefined;
  const next = presetFormDecoration(preset);
  if (deco && typeof deco.mergeTolerance === 'number') next.mergeTolerance = deco.mergeTolerance;
  return { ...params, decoration: next, ...(setAR ? { aR: presetAR(preset) } : {}) };
}

/**
 * The first cluster of the model that uses a preset somewhere other than the site it is meant for (its class is
 * missing, elsewhere in the 6D cell, or has another window), so the panel can offer to put it there.
 */
export function presetOffSite(params: Params): { preset: PresetName; cluster: number; at: string } | undefined {
  const deco = params.decoration as Partial<DecorationParams> | undefined;
  if (!deco || !Array.isArray(deco.clusters)) return undefined;
  const classes = Array.isArray(deco.classes) ? deco.classes : [];
  for (let i = 0; i < deco.clusters.length; i++) {
    const c = deco.clusters[i];
    const name = c?.preset;
    if (!name || !(PRESET_NAMES as readonly string[]).includes(name)) continue;
    const site = CLUSTER_PRESETS[name].site!;
    const k = classes.find((x) => x && x.name === c.at);
    const position = k?.position ?? 'node';
    const onSite = k !== undefined && position === site.position && k.window?.kind === 'hypercube' && Math.abs((k.window.scale ?? 1) - site.windowScale) < 1e-6;
    if (!onSite) return { preset: name, cluster: i, at: c.at };
  }
  return undefined;
}
