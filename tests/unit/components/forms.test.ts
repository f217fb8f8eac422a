/**
 * The model form read from the schemas' JSON Schema (components/forms/describe.ts): the control each field
 * gets, its bounds, its words and units, where a new field starts, and the messages the form shows.
 * Outside references for the convergent lists in the approximant help: the Fibonacci numbers (OEIS A000045),
 * whose ratios F(n+1)/F(n) are the convergents of τ, and the Pell numbers (OEIS A000129: 0, 1, 2, 5, 12, 29,
 * 70), whose ratios P(n+1)/P(n) are the convergents of 1+√2.
 */
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { describeSchema, fieldAt, initialValue, type FieldInfo } from '../../../components/forms/describe';
import { FAMILIES, schemaFor, starterParams, validate, withIcoMode, type Params } from '../../../components/forms/families';
import { formMessages } from '../../../components/forms/messages';
import { plainError } from '../../../lib/zod-text';

function formOf(p: Params): FieldInfo {
  return describeSchema(schemaFor(p)!);
}

function at(p: Params, path: string): FieldInfo {
  const f = fieldAt(formOf(p), path, p);
  if (!f) throw new Error(`no field ${path} in ${p.family}`);
  return f;
}

/** Every field under a description with its dotted path (list items as "[]"). */
function walk(f: FieldInfo, path = ''): [string, FieldInfo][] {
  const s = f.shape;
  const here: [string, FieldInfo][] = path ? [[path, f]] : [];
  const join = (k: string) => (path ? `${path}.${k}` : k);
  if (s.kind === 'object') return [...here, ...s.fields.flatMap((x) => walk(x.info, join(x.key)))];
  if (s.kind === 'array') return [...here, ...walk(s.element, join('[]'))];
  if (s.kind === 'variants') return [...here, ...s.options.flatMap((o) => walk(o.info, join(o.value)))];
  if (s.kind === 'choice') return [...here, ...s.options.flatMap((o, i) => walk(o, join(`(${i})`)).filter(([, x]) => x.shape.kind === 'tuple'))];
  return here;
}

const chain: Params = { family: 'fibonacci' };
const penrose: Params = { family: 'penrose' };
const octagonal: Params = { family: 'octagonal' };
const decagonal: Params = { family: 'decagonal' };
const icoApprox: Params = { family: 'icosahedral', mode: 'approximant' };
const icoPatch: Params = { family: 'icosahedral', mode: 'patch' };

describe('form fields from the JSON Schema', () => {
  it('chain: an integer order 0–60, a switch, lengths in Å and the point cap in points', () => {
    expect(at(chain, 'order')).toMatchObject({ shape: { kind: 'number', integer: true, min: 0, max: 60 }, optional: false, title: 'Substitution order n' });
    expect(at(chain, 'approximant')).toMatchObject({ shape: { kind: 'boolean' }, fallback: false, title: 'Periodic approximant' });
    expect(at(chain, 'long')).toMatchObject({ shape: { kind: 'number', integer: false, max: 10_000 }, unit: 'Å', fallback: 1 });
    expect(at(chain, 'maxPoints')).toMatchObject({ shape: { kind: 'number', integer: true, min: 1, max: 50_000_000 }, title: 'Point cap', unit: 'points', fallback: 2_000_000 });
  });

  it('planar: an optional patch radius, an optional p/q group and the family’s own convergents in its help', () => {
    for (const p of [penrose, octagonal]) {
      expect(at(p, 'radius')).toMatchObject({ shape: { kind: 'number', max: 100_000 }, optional: true, title: 'Patch radius', unit: 'Å' });
      const approx = at(p, 'approximant');
      expect(approx).toMatchObject({ shape: { kind: 'object' }, optional: true, title: 'Periodic approximant' });
      // p and q are integers ≥ 1 with no upper bound (zod's ±2^53 integer range is not shown as a limit).
      expect(at(p, 'approximant.q')).toMatchObject({ shape: { kind: 'number', integer: true, min: 1, max: undefined }, title: 'q' });
      expect(at(p, 'gamma')).toMatchObject({ shape: { kind: 'array', element: { shape: { kind: 'number', min: -100, max: 100 } } }, optional: true });
    }
    expect(at(penrose, 'approximant').help).toContain('1/1, 2/1, 3/2, 5/3, 8/5');
    expect(at(octagonal, 'approximant').help).toContain('2/1, 5/2, 12/5, 29/12, 70/29');
    // A switched-on grid offset list has one entry per grid direction: 5 for Penrose, 4 for Ammann–Beenker.
    expect(initialValue(at(penrose, 'gamma'))).toEqual([0, 0, 0, 0, 0]);
    expect(initialValue(at(octagonal, 'gamma'))).toEqual([0, 0, 0, 0]);
  });

  it('decagonal: a two-entry layer shift in Å, integer layers, exactly five grid offsets', () => {
    const shift = at(decagonal, 'shift');
    expect(shift).toMatchObject({ shape: { kind: 'tuple' }, unit: 'Å', fallback: [0, 0] });
    expect(shift.shape.kind === 'tuple' && shift.shape.items.map((i) => i.shape)).toEqual([
      { kind: 'number', integer: false, min: -1000, max: 1000 },
      { kind: 'number', integer: false, min: -1000, max: 1000 },
    ]);
    expect(at(decagonal, 'layers')).toMatchObject({ shape: { kind: 'number', integer: true, min: 1, max: 1000 }, title: 'Layers per period' });
    expect(at(decagonal, 'spacing')).toMatchObject({ unit: 'Å', title: 'Layer spacing', fallback: 2.04 });
    expect(at(decagonal, 'gamma')).toMatchObject({ shape: { kind: 'array', min: 5, max: 5 } });
  });

  it('icosahedral: order text, lattice choice, vector offset, and the decoration’s lists, choices and shapes', () => {
    expect(at(icoApprox, 'order')).toMatchObject({ shape: { kind: 'string' }, title: 'Order p/q', example: '2/1' });
    expect(at(icoApprox, 'lattice')).toMatchObject({ shape: { kind: 'enum', options: ['P', 'F', 'I'] }, fallback: 'P' });
    expect(at(icoApprox, 'lattice').optionLabels?.F).toMatch(/face-centred/);
    expect(at(icoApprox, 'offset')).toMatchObject({ shape: { kind: 'tuple' }, unit: 'Å, perp. space', fallback: [0, 0, 0] });
    expect(at(icoApprox, 'decoration')).toMatchObject({ shape: { kind: 'object' }, optional: true });
    expect(at(icoApprox, 'decoration.classes')).toMatchObject({ shape: { kind: 'array', min: 1, max: 64 } });
    expect(at(icoApprox, 'decoration.clusters')).toMatchObject({ shape: { kind: 'array', max: 8 }, optional: true });

    const p = { ...icoApprox, decoration: { classes: [{ name: 'a', window: { kind: 'sphere', radius: 2 } }] } };
    const position = at(p, 'decoration.classes.0.position');
    expect(position.shape.kind).toBe('choice');
    const kinds = position.shape.kind === 'choice' ? position.shape.options.map((o) => o.shape.kind) : [];
    expect(kinds).toEqual(['enum', 'tuple']);
    const window = at(p, 'decoration.classes.0.window');
    expect(window.shape.kind === 'variants' && window.shape.discriminator).toBe('kind');
    expect(window.shape.kind === 'variants' && window.shape.options.map((o) => o.value)).toEqual(['hypercube', 'sphere', 'shell']);
    // The path follows the variant the value is: a sphere's radius is a perpendicular-space length.
    expect(at(p, 'decoration.classes.0.window.radius')).toMatchObject({ title: 'Sphere radius', unit: 'Å, perp. space' });
    expect(at(p, 'decoration.classes.0.mix')).toMatchObject({ shape: { kind: 'record', value: { shape: { kind: 'number', min: 0, max: 1 } } }, optional: true });

    // A cluster's site class is picked from the names of the decoration's classes.
    expect(at({ ...p, decoration: { ...p.decoration, clusters: [{ at: 'a', preset: 'tsai' }] } }, 'decoration.clusters.0.at')).toMatchObject({ shape: { kind: 'string' }, namesOf: 'classes' });
    expect(at({ ...p, decoration: { ...p.decoration, clusters: [{ at: 'a', preset: 'tsai' }] } }, 'decoration.clusters.0.preset').optionLabels?.tsai).toMatch(/YbCd/);

    expect(at(icoPatch, 'radius')).toMatchObject({ shape: { kind: 'number', max: 10_000 }, optional: false, title: 'Patch radius', unit: 'Å' });
    expect(at(icoPatch, 'centre')).toMatchObject({ shape: { kind: 'tuple' }, unit: 'Å' });
  });

  it('every field a form draws has a label from its schema, and every length a unit in Å', () => {
    const lengths = /radius|edge|aR|long|spacing|shift|offset|centre|r1|r2|mergeTolerance/;
    const withDecoration = { ...icoApprox, decoration: { classes: [{ name: 'a' }], clusters: [] } };
    for (const p of [chain, penrose, octagonal, decagonal, icoPatch, withDecoration]) {
      for (const [path, f] of walk(formOf(p))) {
        // Plain numbers in a list are named by the list ("Grid offsets γ 2"); a variant's tag is the shape picker.
        if (f.shape.kind === 'literal' || (path.endsWith('[]') && f.shape.kind === 'number')) continue;
        expect(f.title, `${p.family} ${path}`).toBeTruthy();
        const key = path.split('.').pop()!;
        // The chain's phason offset is in units of the short segment's perpendicular image, not Å.
        if (lengths.test(key) && !(p.family === 'fibonacci' && key === 'offset')) expect(f.unit, `${p.family} ${path}`).toMatch(/^Å/);
      }
    }
  });
});

describe('starting values', () => {
  it('every family starts from a model its schema accepts (its starter)', () => {
    for (const family of FAMILIES) expect(validate(starterParams(family)), family).toBeUndefined();
    expect(starterParams('octagonal')).toMatchObject({ family: 'octagonal', approximant: { p: 12, q: 5 } });
  });

  it('switching a group on, a shape or a cut starts from values the schema accepts', () => {
    const base = starterParams('penrose');
    expect(validate({ ...base, approximant: initialValue(at(base, 'approximant')) })).toBeUndefined();
    const ico = starterParams('icosahedral');
    const decoration = initialValue(at(ico, 'decoration'));
    expect(validate({ ...ico, decoration })).toBeUndefined();
    const window = at({ ...ico, decoration }, 'decoration.classes.0.window');
    for (const o of window.shape.kind === 'variants' ? window.shape.options : []) {
      const d = structuredClone(decoration) as { classes: Record<string, unknown>[] };
      d.classes[0].window = initialValue(o.info);
      expect(validate({ ...ico, decoration: d }), o.value).toBeUndefined();
    }
    expect(validate(withIcoMode(ico, 'patch'))).toBeUndefined();
    expect(validate(withIcoMode(withIcoMode(ico, 'patch'), 'approximant'))).toBeUndefined();
  });
});

describe('messages', () => {
  it('one plain message per field, named as labelled, with the unit; no validator wording', () => {
    const p = {
      ...starterParams('icosahedral'),
      aR: 'abc',
      offset: ['abc', 0, 0],
      maxPoints: 60_000_000,
      decoration: { classes: [{ name: '', window: { kind: 'sphere', radius: 2000 } }], mergeTolerance: '' },
    };
    const error = validate(p);
    const byPath = formMessages(error, formOf(p), p);
    expect(Object.fromEntries(byPath)).toEqual({
      aR: 'Rhombohedron edge a_R: must be a number',
      'offset.0': 'Phason offset x: must be a number',
      maxPoints: 'Point cap: must be at most 50,000,000',
      'decoration.classes.0.name': 'Name: must not be empty',
      'decoration.classes.0.window.radius': 'Sphere radius: must be at most 1000 Å, perp. space',
      'decoration.mergeTolerance': 'Merge tolerance: needs a value',
    });
    // The count the workspace shows is the number of messages.
    expect(error!.issues.length).toBe(byPath.size);
  });

  it('a whole number where an integer is asked, and the schema’s own words where it has them', () => {
    const p = { family: 'decagonal', radius: 8, layers: 1.5 };
    expect(formMessages(validate(p), formOf(p), p).get('layers')).toBe('Layers per period: must be an integer');
    const n = z.number().int().max(5).meta({ unit: 'Å' });
    expect(n.safeParse(1.5, { error: plainError }).error!.issues[0].message).toBe('must be a whole number');
    expect(n.safeParse(6, { error: plainError }).error!.issues[0].message).toBe('must be at most 5 Å');
    expect(z.number().gt(0).safeParse(0, { error: plainError }).error!.issues[0].message).toBe('must be more than 0');
    expect(z.array(z.number()).min(2).safeParse([1], { error: plainError }).error!.issues[0].message).toBe('needs at least 2 entries');
    expect(z.number().max(5, 'too far').safeParse(6, { error: plainError }).error!.issues[0].message).toBe('too far');
  });

  it('a message about a field the form does not draw still names it', () => {
    // A periodic approximant hides the patch radius; a wrong radius must still be said somewhere, in words.
    const p = { family: 'penrose', approximant: { p: 2, q: 1 }, radius: -1 };
    expect(formMessages(validate(p), formOf(p), p).get('radius')).toBe('Patch radius: must be positive');
  });
});
