/**
 * Every file the command line writes regenerates byte for byte from the params it records
 * (DESIGN.md: "the params recorded in a file always regenerate it"; issue #9).
 *
 * The reference is the file itself: the bytes a model command wrote, read back with the format readers
 * (lib/formats/read.ts), its recorded params given to generate() (lib/models) and written again in the
 * same format. It fails when a command builds a Structure some other way than generate(), records params
 * that differ from the ones it used, or a writer/reader pair loses a digit of the params.
 * The formats are taken from each command's own --format choices, so a new format is covered by itself.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { cli } from '../../helpers/cli';
import { buildProgram } from '../../../scripts/cli/program';
import { readStructure, sniffFormat, type StructureFormat } from '../../../lib/formats/read';
import { exportFile, STRUCTURE_FORMATS } from '../../../lib/formats/write';
import { generate } from '../../../lib/models';
import { ENGINE_VERSION } from '../../../lib/version';

const dir = mkdtempSync(join(tmpdir(), 'tf-roundtrip-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

// Two site classes (one pure, one mixed occupancy), Mackay clusters on one of them, and merging:
// every part of the decoration schema that changes the atoms.
const decorationFile = join(dir, 'decoration.json');
writeFileSync(
  decorationFile,
  JSON.stringify({
    classes: [
      { name: 'vertex', position: 'node', window: { kind: 'hypercube', scale: 1 }, species: 'Mn' },
      { name: 'centre', position: 'body', window: { kind: 'sphere', radius: 3.1 }, mix: { Al: 0.6, Pd: 0.3 } },
    ],
    clusters: [{ at: 'centre', preset: 'mackay' }],
    mergeTolerance: 0.5,
  }),
);

interface Case {
  command: string;
  args: string[];
  /** Params the flags must have put into the file (a few keys, not a copy of the command's logic). */
  records: Record<string, unknown>;
}

const CASES: Case[] = [
  { command: 'chain', args: ['--order', '8', '--offset', '0.3', '--long', '2.5'], records: { family: 'fibonacci', order: 8, offset: 0.3, long: 2.5, approximant: false } },
  { command: 'chain', args: ['--order', '7', '--approximant', '--ratio', '1.7'], records: { family: 'fibonacci', order: 7, ratio: 1.7, approximant: true } },
  { command: 'tiling', args: ['--family', 'penrose', '--radius', '6', '--edge', '1.3'], records: { family: 'penrose', radius: 6, edge: 1.3 } },
  { command: 'tiling', args: ['--family', 'octagonal', '--approximant', '5/2', '--edge', '2'], records: { family: 'octagonal', approximant: { p: 5, q: 2 }, edge: 2 } },
  {
    command: 'patch',
    args: ['--family', 'icosahedral', '--radius', '9', '--aR', '4.6', '--offset', '0.1,0.2,0.3', '--centre', '1,0,0', '--species', 'Al'],
    records: { family: 'icosahedral', mode: 'patch', radius: 9, aR: 4.6, offset: [0.1, 0.2, 0.3], centre: [1, 0, 0], species: 'Al' },
  },
  {
    command: 'patch',
    args: ['--family', 'icosahedral', '--radius', '9', '--aR', '4.6', '--decoration', decorationFile],
    records: { family: 'icosahedral', mode: 'patch', radius: 9, aR: 4.6, decoration: expect.objectContaining({ mergeTolerance: 0.5 }) },
  },
  {
    command: 'approximant',
    // --cif-symmetry p1: the byte comparison below regenerates with writeStructure (P 1); the default CIF
    // with the space group is read back by gemmi and ASE in tests/unit/formats/cif-symmetry.test.ts.
    args: ['--family', 'icosahedral', '--order', '2/1', '--aR', '4.6', '--lattice', 'P', '--species', 'Al', '--cif-symmetry', 'p1'],
    records: { family: 'icosahedral', mode: 'approximant', order: '2/1', aR: 4.6, lattice: 'P', species: 'Al' },
  },
  {
    command: 'approximant',
    args: ['--family', 'icosahedral', '--order', '1/1', '--aR', '4.6', '--decoration', decorationFile, '--cif-symmetry', 'p1'],
    records: { family: 'icosahedral', mode: 'approximant', order: '1/1', decoration: expect.objectContaining({ mergeTolerance: 0.5 }) },
  },
  {
    command: 'approximant',
    args: ['--family', 'decagonal', '--order', '2/1', '--aR', '2.45', '--species', 'Al'],
    records: { family: 'decagonal', approximant: { p: 2, q: 1 }, edge: 2.45, species: 'Al' },
  },
];

/** The --format choices a command offers (read from the program, not repeated here). */
function formatsOf(command: string): string[] {
  const cmd = buildProgram().commands.find((c) => c.name() === command);
  const choices = cmd?.options.find((o) => o.long === '--format')?.argChoices;
  if (!choices) throw new Error(`${command}: no --format choices`);
  return choices;
}

/** The choices we also read back (POSCAR and LAMMPS data are input files for other codes: tests/unit/cli/export.test.ts). */
function readableFormatsOf(command: string): StructureFormat[] {
  return formatsOf(command).filter((f): f is StructureFormat => (STRUCTURE_FORMATS as readonly string[]).includes(f));
}

describe('command line files regenerate from their recorded params', () => {
  it('covers every command that writes a model', () => {
    const modelCommands = buildProgram()
      .commands.map((c) => c.name())
      .filter((n) => n !== 'convergents' && n !== 'diffract' && n !== 'check' && n !== 'symmetrise');
    expect(new Set(CASES.map((c) => c.command))).toEqual(new Set(modelCommands));
  });

  const titled = CASES.map((c) => ({ ...c, title: [c.command, ...c.args.map((a) => (a === decorationFile ? 'decoration.json' : a))].join(' ') }));
  it.each(titled)('$title', async ({ command, args, records }) => {
    const formats = readableFormatsOf(command);
    const recorded: unknown[] = [];
    for (const format of formats) {
      const r = await cli([command, ...args, '--format', format]);
      // Standard error carries only notes ('# …' lines, e.g. the space group) and the check's warnings, never errors.
      expect(r.err.split('\n').filter((l) => l !== '' && !l.startsWith('# ') && !/^check (severe|warning): /.test(l)), format).toEqual([]);
      expect(r.code, format).toBe(0);
      expect(sniffFormat(r.out), format).toBe(format);
      const s = readStructure(r.out);
      expect(s.species.length, format).toBeGreaterThan(0);
      expect(s.provenance.engine, format).toBe(ENGINE_VERSION);
      expect(s.provenance.params, format).toMatchObject(records);
      if (format === 'xyz') {
        // Plain XYZ has no fields: the params are the JSON after "params=" on the comment line.
        const comment = r.out.split('\n')[1];
        expect(JSON.parse(/ params=(.*)$/.exec(comment)![1])).toEqual(s.provenance.params);
      }
      // The same export pipeline (check, wrap, comment) on the regenerated cut gives the same bytes.
      expect(exportFile(generate(s.provenance.params), format).text, `${command} --format ${format}`).toBe(r.out);
      recorded.push(s.provenance.params);
    }
    // Every format records the same params.
    for (const p of recorded.slice(1)) expect(p).toEqual(recorded[0]);
  });

  it('patch offers no CIF: a ball has no cell (exit 2, naming the choices)', async () => {
    expect(formatsOf('patch')).toEqual(['xyz', 'extxyz', 'json']);
    const r = await cli(['patch', '--family', 'icosahedral', '--radius', '5', '--aR', '4.6', '--format', 'cif']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/--format .*xyz, extxyz, json/);
  });
});
