/**
 * The demo projects' descriptions say what their params generate. Each fact a description states is
 * recomputed here from generate(), so a change of params or words that lets them drift apart fails.
 * Outside source for the chain: the Fibonacci numbers, OEIS A000045 — the order-n approximant of the
 * chain is F(n+1)/F(n), with F(n+1) long and F(n) short segments per cell.
 */
import { describe, expect, it } from 'vitest';
import { generate } from '../../../lib/models';
import type { Structure } from '../../../lib/structure/types';
import { DEMO_PROJECTS } from '../../../db/seeds/01_demo';

/** OEIS A000045, F(0)…F(15). */
const F = [0, 1, 1, 2, 3, 5, 8, 13, 21, 34, 55, 89, 144, 233, 377, 610];

function tileCounts(s: Structure): Record<string, number> {
  const out: Record<string, number> = {};
  if (s.tiles) for (const k of s.tiles.kind) out[s.tiles.kinds[k]] = (out[s.tiles.kinds[k]] ?? 0) + 1;
  return out;
}

/** The phrases a description of these params must contain, computed from the cut. */
function facts(params: Record<string, unknown>, s: Structure): string[] {
  const n = s.species.length;
  const tiles = tileCounts(s);
  switch (params.family) {
    case 'fibonacci': {
      const order = params.order as number;
      expect(n).toBe(F[order + 2]);
      expect(tiles).toEqual({ L: F[order + 1], S: F[order] });
      return [`${F[order + 1]}/${F[order]} approximant`, `order ${order}`, `${n} segments`, `${tiles.L} long (${params.long} Å)`, `${tiles.S} short`, `${s.cell![0][0].toFixed(1)} Å`];
    }
    case 'penrose':
      return [`radius ${params.radius} Å`, `${params.edge} Å edges`, `${n} vertices`, `${tiles.thick} thick`, `${tiles.thin} thin`];
    case 'icosahedral': {
      expect(s.species.every((z) => z === 0), 'undecorated: every point an unassigned vertex').toBe(true);
      const [a, b, c] = s.cell!;
      expect([a[0], b[1], c[2]].every((x) => Math.abs(x - a[0]) < 1e-9)).toBe(true);
      return ['Undecorated', `${params.order} cubic approximant`, `a_R = ${params.aR} Å`, `${n} vertices`, `cube of edge ${a[0].toFixed(2)} Å`];
    }
    default:
      throw new Error(`no facts known for family ${String(params.family)}: add them here`);
  }
}

describe('demo seed descriptions', () => {
  it.each(DEMO_PROJECTS.map((p) => [p.name, p] as const))('%s says what its params generate', (_name, p) => {
    const s = generate(p.params);
    for (const fact of facts(p.params, s)) expect(p.description).toContain(fact);
    // The only p/q a description names is the one its params cut (the old chain text named 13/8 for 89/55).
    const ratios = p.description.match(/\b\d+\/\d+\b/g) ?? [];
    const own = p.params.family === 'fibonacci' ? `${F[p.params.order + 1]}/${F[p.params.order]}` : 'order' in p.params ? p.params.order : null;
    for (const r of ratios) expect(r).toBe(own);
  });
});
