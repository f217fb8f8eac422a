/**
 * The Check step and the simulation exports over the API: the report for a revision and for a posted file, POSCAR
 * and LAMMPS exports with a supercell read back by ASE (ase.io.read vasp / lammps-data), and clear errors that
 * store nothing (RFC 9110 §15: 422 Unprocessable Content, 400 Bad Request).
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, db } from '../../lib/server/db';
import * as checkRoute from '../../app/api/projects/[id]/check/route';
import * as exportsRoute from '../../app/api/projects/[id]/exports/route';
import * as downloadRoute from '../../app/api/exports/[id]/download/route';
import { call, makeProject, makeUser, type TestUser } from './api-fixtures';
import { runPython } from '../helpers/python';

let owner: TestUser;
let project: number;
let revision: number;
let patchRevision: number;
beforeAll(async () => {
  owner = await makeUser('check-owner');
  const p = await makeProject(owner, []);
  project = p.id;
  // A generic phason offset: 32 whole atoms (the symmetric 1/1 has fractional boundary sites POSCAR cannot hold).
  const params = { family: 'icosahedral', mode: 'approximant', order: '1/1', aR: 4.6, lattice: 'P', species: 'Al', offset: [0.31, 0.17, 0.05] };
  [revision] = await db()('revisions').insert({ project_id: p.id, number: 3, params: JSON.stringify(params), message: 'ico', author_id: owner.id });
  [patchRevision] = await db()('revisions').insert({ project_id: p.id, number: 4, params: JSON.stringify({ family: 'icosahedral', mode: 'patch', radius: 6, aR: 4.6, species: 'Al' }), message: 'patch', author_id: owner.id });
});
afterAll(closeDb);

/** Exports are written by the queue worker that `npm test` starts: ask until the stored file is there (200). */
async function exportWhenReady(body: Record<string, unknown>): Promise<{ first: number; info: Record<string, unknown> & { downloadUrl: string; id: number } }> {
  const r = await post(exportsRoute, 'exports', body);
  const first = r.status;
  if (first === 200) return { first, info: await r.json() };
  expect(first, await r.clone().text()).toBe(202);
  for (let i = 0; i < 480; i++) {
    await new Promise((ok) => setTimeout(ok, 250));
    const again = await post(exportsRoute, 'exports', body);
    if (again.status === 200) return { first, info: await again.json() };
    expect(again.status).toBe(202);
  }
  throw new Error('the export job did not finish within 2 minutes');
}

const post = (mod: Record<string, unknown>, path: string, body: unknown) => call(mod, 'POST', `/api/projects/${project}/${path}`, { params: { id: String(project) }, cookie: owner.cookie, body });

describe('POST /api/projects/{id}/check', () => {
  it('reports a revision: 32 Al atoms of the 1/1 cell, density flagged against the close-packed ideal', async () => {
    const r = await post(checkRoute, 'check', { revision });
    expect(r.status).toBe(200);
    const body = await r.json();
    expect(body.revision).toBe(Number(revision));
    expect(body.report.atoms).toBe(32);
    expect(body.report.severe).toBe(true);
    expect(body.report.warnings[0].code).toBe('density-low');
  });

  it('reports a posted file: fcc Al written by ase.io.write (CIF), no warnings', async () => {
    const cif = runPython<string>("import io, json\nfrom ase.build import bulk\nfrom ase.io import write\nb = io.BytesIO()\nwrite(b, bulk('Al', 'fcc', a=4.05, cubic=True), format='cif')\nprint(json.dumps(b.getvalue().decode()))");
    const r = await post(checkRoute, 'check', { structure: cif, filename: 'al.cif' });
    expect(r.status).toBe(200);
    const { report } = await r.json();
    expect(report.pairs[0].shortest).toBeCloseTo(4.05 / Math.SQRT2, 5);
    expect(report.warnings).toEqual([]);
    // Its space group: F m -3 m, No. 225 (fcc; International Tables).
    expect(report.spaceGroup).toEqual({ number: 225, symbol: 'F m -3 m' });
  });

  it('unreadable files and bad bodies get clear errors', async () => {
    const bad = await post(checkRoute, 'check', { structure: 'hello', filename: 'x.xyz' });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.message).toMatch(/XYZ/);
    const neither = await post(checkRoute, 'check', { nothing: 1 });
    expect(neither.status).toBe(400);
    const missing = await post(checkRoute, 'check', { revision: 999999999 });
    expect(missing.status).toBe(404);
  });
});

describe('POST /api/projects/{id}/exports: POSCAR and LAMMPS with a supercell', () => {
  it('POSCAR 2x1x1 reads in ASE as 64 atoms in a doubled cell; asking again reuses it', async () => {
    const { first, info } = await exportWhenReady({ revision, format: 'poscar', supercell: '2x1x1' });
    expect(first).toBe(202);
    expect(info.format).toBe('poscar');
    expect(info.supercell).toBe('2x1x1');
    expect(info.filename).toMatch(/-r3-2x1x1\.vasp$/);
    const again = await post(exportsRoute, 'exports', { revision, format: 'poscar', supercell: '2x1x1' });
    expect(again.status).toBe(200);
    const d = await call(downloadRoute, 'GET', info.downloadUrl, { params: { id: String(info.id) }, cookie: owner.cookie });
    const text = await d.text();
    const ase = runPython<{ n: number; a: number; b: number }>('import sys, io, json\nfrom ase.io import read\na = read(io.StringIO(sys.stdin.read()), format="vasp")\nl = a.cell.lengths()\nprint(json.dumps({"n": len(a), "a": l[0], "b": l[1]}))', text);
    expect(ase.n).toBe(64);
    expect(ase.a).toBeCloseTo(2 * ase.b, 8);
  });

  it('LAMMPS data reads in ASE (lammps-data, atomic) with 32 atoms', async () => {
    const { info } = await exportWhenReady({ revision, format: 'lammps' });
    const d = await call(downloadRoute, 'GET', info.downloadUrl, { params: { id: String(info.id) }, cookie: owner.cookie });
    const n = runPython<number>('import sys, io, json\nfrom ase.io import read\nprint(json.dumps(len(read(io.StringIO(sys.stdin.read()), format="lammps-data", style="atomic"))))', await d.text());
    expect(n).toBe(32);
  });

  it('CIF carries the space group by default and P 1 with cifSymmetry p1; gemmi expands both to 32 atoms', async () => {
    const GEMMI = 'import sys, json, gemmi\nst = gemmi.make_small_structure_from_block(gemmi.cif.read_string(sys.stdin.read()).sole_block())\ng = st.find_spacegroup()\nprint(json.dumps({"number": g.number if g else None, "expanded": len(st.get_all_unit_cell_sites())}))';
    const found = await exportWhenReady({ revision, format: 'cif' });
    expect(found.info.cifSymmetry).toBe('found');
    const text = await (await call(downloadRoute, 'GET', found.info.downloadUrl, { params: { id: String(found.info.id) }, cookie: owner.cookie })).text();
    const note = /^# Tauforge symmetry: (.*)$/m.exec(text)![1];
    const back = runPython<{ number: number; expanded: number }>(GEMMI, text);
    expect(back.expanded).toBe(32);
    if (back.number > 1) expect(note).toMatch(new RegExp(`\\(No\\. ${back.number}\\) found by moyo`));
    else expect(note).toMatch(/^P 1 with all 32 atoms: /);
    const p1 = await exportWhenReady({ revision, format: 'cif', cifSymmetry: 'p1' });
    expect(p1.info).toMatchObject({ format: 'cif', cifSymmetry: 'p1' });
    expect(p1.info.filename).toMatch(/-r3-p1\.cif$/);
    const p1Text = await (await call(downloadRoute, 'GET', p1.info.downloadUrl, { params: { id: String(p1.info.id) }, cookie: owner.cookie })).text();
    expect(p1Text).toMatch(/^# Tauforge symmetry: P 1 with all 32 atoms: the 'P 1, all atoms' choice$/m);
    expect(runPython<{ number: number; expanded: number }>(GEMMI, p1Text)).toEqual({ number: 1, expanded: 32 });
    const wrong = await post(exportsRoute, 'exports', { revision, format: 'xyz', cifSymmetry: 'p1' });
    expect(wrong.status).toBe(422);
    expect((await wrong.json()).error.message).toMatch(/cifSymmetry applies to CIF exports only/);
  });

  it('a finite patch cannot become a POSCAR: 422 naming the reason, nothing stored', async () => {
    const before = Number((await db()('exports').where({ revision_id: patchRevision }).count<{ n: number }[]>({ n: '*' }))[0].n);
    const r = await post(exportsRoute, 'exports', { revision: patchRevision, format: 'poscar' });
    expect(r.status).toBe(422);
    expect((await r.json()).error.message).toMatch(/POSCAR needs a periodic cell/);
    const bad = await post(exportsRoute, 'exports', { revision, format: 'poscar', supercell: '0x1x1' });
    expect(bad.status).toBe(400);
    const after = Number((await db()('exports').where({ revision_id: patchRevision }).count<{ n: number }[]>({ n: '*' }))[0].n);
    expect(after).toBe(before);
  });
});
