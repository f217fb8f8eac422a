import { ENGINE_VERSION } from '../version';
import { symbolOf, tryAtomicNumber } from '../structure/elements';
import type { Cell, SiteClass, Structure } from '../structure/types';
import { perpDimension, validateStructure } from '../structure/validate';
import { FormatError } from './errors';
import { canonicalJson } from './canonical-json';
import { fixed } from './number';

/**
 * Tauforge JSON: keys in this order
 * `{"cell": [[ax,ay,az],[bx,by,bz],[cx,cy,cz]] | null, "positions": [[x,y,z],…], "species": ["Al",…],
 *   "site": [...] | null, "perp": [[…],…] | null, "provenance": {…}}`
 * followed, only when the Structure has them, by "siteClasses", "occupancy" and "dim" so a
 * round trip keeps them. Numbers are fixed-point with 8 decimals (exact to 1e-8 Å); object keys in
 * provenance are sorted, so the same Structure always gives the same bytes.
 */
export function writeJson(s: Structure): string {
  validateStructure(s);
  const n = s.species.length;
  const p = s.positions;
  const cell = s.cell ? `[${s.cell.map((v) => `[${v.map((x) => fixed(x)).join(',')}]`).join(',')}]` : 'null';
  const rows: string[] = new Array(n);
  for (let i = 0; i < n; i++) rows[i] = `[${fixed(p[3 * i])},${fixed(p[3 * i + 1])},${fixed(p[3 * i + 2])}]`;
  const species = Array.from(s.species, (z) => JSON.stringify(symbolOf(z)));
  const site = s.site ? `[${Array.from(s.site).join(',')}]` : 'null';
  let perp = 'null';
  if (s.perp) {
    const d = perpDimension(s);
    const pr: string[] = new Array(n);
    for (let i = 0; i < n; i++) {
      const c: string[] = [];
      for (let k = 0; k < d; k++) c.push(fixed(s.perp[d * i + k]));
      pr[i] = `[${c.join(',')}]`;
    }
    perp = `[${pr.join(',')}]`;
  }
  const parts = [
    `"cell":${cell}`,
    `"positions":[${rows.join(',')}]`,
    `"species":[${species.join(',')}]`,
    `"site":${site}`,
    `"perp":${perp}`,
    `"provenance":${canonicalJson({ engine: s.provenance.engine, params: s.provenance.params ?? null })}`,
  ];
  if (s.siteClasses) parts.push(`"siteClasses":${canonicalJson(s.siteClasses)}`);
  if (s.occupancy) parts.push(`"occupancy":[${Array.from(s.occupancy, (x) => fixed(x, 6)).join(',')}]`);
  if (s.dim !== undefined) parts.push(`"dim":${s.dim}`);
  return `{${parts.join(',')}}\n`;
}

const F = 'JSON';

function isNumArray(v: unknown, len?: number): v is number[] {
  return Array.isArray(v) && (len === undefined || v.length === len) && v.every((x) => typeof x === 'number' && Number.isFinite(x));
}

/** Read Tauforge JSON (see writeJson). Errors name the key and the atom index at fault. */
export function readJson(text: string): Structure {
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new FormatError(F, `not valid JSON (${(e as Error).message})`);
  }
  if (doc === null || typeof doc !== 'object' || Array.isArray(doc)) throw new FormatError(F, 'expected an object at the top level');
  const o = doc as Record<string, unknown>;
  if (!Array.isArray(o.positions)) throw new FormatError(F, '"positions" must be an array of [x,y,z]');
  if (!Array.isArray(o.species)) throw new FormatError(F, '"species" must be an array of element symbols');
  const n = o.positions.length;
  if (o.species.length !== n) {
    throw new FormatError(F, `"species" has ${o.species.length} entries but "positions" has ${n}`);
  }
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  for (let i = 0; i < n; i++) {
    const r = o.positions[i];
    if (!isNumArray(r, 3)) throw new FormatError(F, `positions[${i}] must be three finite numbers`);
    positions.set(r, 3 * i);
    const sym = o.species[i];
    const z = typeof sym === 'string' ? tryAtomicNumber(sym) : undefined;
    if (z === undefined) throw new FormatError(F, `species[${i}] = ${JSON.stringify(sym)} is not a known element`);
    species[i] = z;
  }
  const s: Structure = {
    positions,
    species,
    provenance: { engine: ENGINE_VERSION, params: { source: 'json' } },
  };
  if (o.cell !== undefined && o.cell !== null) {
    if (!Array.isArray(o.cell) || o.cell.length !== 3 || !o.cell.every((v) => isNumArray(v, 3))) {
      throw new FormatError(F, '"cell" must be null or three vectors [[ax,ay,az],[bx,by,bz],[cx,cy,cz]]');
    }
    s.cell = o.cell.map((v) => [v[0], v[1], v[2]]) as Cell;
  }
  if (o.site !== undefined && o.site !== null) {
    if (!Array.isArray(o.site) || o.site.length !== n) throw new FormatError(F, `"site" must be null or ${n} integers`);
    s.site = new Uint16Array(n);
    o.site.forEach((v, i) => {
      if (!Number.isInteger(v) || v < 0 || v > 65535) throw new FormatError(F, `site[${i}] = ${JSON.stringify(v)} is not a site index`);
      s.site![i] = v;
    });
  }
  if (o.perp !== undefined && o.perp !== null) {
    if (!Array.isArray(o.perp) || o.perp.length !== n) throw new FormatError(F, `"perp" must be null or ${n} rows`);
    const d = n > 0 && Array.isArray(o.perp[0]) ? o.perp[0].length : 0;
    s.perp = new Float64Array(d * n);
    o.perp.forEach((r, i) => {
      if (!isNumArray(r, d)) throw new FormatError(F, `perp[${i}] must be ${d} finite numbers like perp[0]`);
      s.perp!.set(r, d * i);
    });
    s.perpDim = d;
  }
  if (o.provenance !== undefined) {
    const pv = o.provenance as Record<string, unknown> | null;
    if (pv === null || typeof pv !== 'object' || typeof pv.engine !== 'string') {
      throw new FormatError(F, '"provenance" must be an object with a string "engine"');
    }
    s.provenance = { engine: pv.engine, params: pv.params ?? null };
  }
  if (o.siteClasses !== undefined) {
    if (!Array.isArray(o.siteClasses)) throw new FormatError(F, '"siteClasses" must be an array');
    o.siteClasses.forEach((c, i) => {
      const sc = c as Partial<SiteClass> | null;
      if (!sc || typeof sc.name !== 'string' || typeof sc.species !== 'number') {
        throw new FormatError(F, `siteClasses[${i}] must have a string "name" and a numeric "species"`);
      }
    });
    s.siteClasses = o.siteClasses as SiteClass[];
  }
  if (o.occupancy !== undefined) {
    if (!isNumArray(o.occupancy, n)) throw new FormatError(F, `"occupancy" must be ${n} numbers`);
    s.occupancy = Float64Array.from(o.occupancy);
  }
  if (o.dim !== undefined) {
    if (o.dim !== 1 && o.dim !== 2 && o.dim !== 3) throw new FormatError(F, '"dim" must be 1, 2 or 3');
    s.dim = o.dim;
  }
  validateStructure(s);
  return s;
}
