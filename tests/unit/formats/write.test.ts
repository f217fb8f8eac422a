/** The export pipeline (lib/formats/write.ts exportFile): check warnings travel in every format's comment line. */
import { describe, expect, it } from 'vitest';
import { exportFile, WRITE_FORMATS } from '@/lib/formats/write';
import { readStructure } from '@/lib/formats';
import type { Structure } from '@/lib/structure';
import { runPython } from '../../helpers/python';

/** fcc Al (a = 4.05 Å) with an extra Mn atom 0.62 Å from the origin: one severe too-close pair. */
function overlapping(): Structure {
  const a = 4.05;
  return {
    positions: new Float64Array([0, 0, 0, a / 2, a / 2, 0, a / 2, 0, a / 2, 0, a / 2, a / 2, 0.5, 0.3, 0.2]),
    species: new Uint16Array([13, 13, 13, 13, 25]),
    cell: [[a, 0, 0], [0, a, 0], [0, 0, a]],
    provenance: { engine: 'tauforge-engine/0.1.0', params: { test: 'overlap' } },
  };
}

describe('exportFile: the check travels with every export', () => {
  it.each(WRITE_FORMATS.filter((f) => f !== 'json'))('%s carries the severe warning in its comment', (format) => {
    const { text, report } = exportFile(overlapping(), format);
    expect(report.severe).toBe(true);
    const lines = text.split('\n');
    const where = { xyz: lines[1], extxyz: lines[1], cif: lines[1], poscar: lines[0], lammps: lines[1] }[format as 'xyz'];
    expect(where).toMatch(/check: SEVERE 1 pair closer than 80 % of the sum of metallic radii/);
    // ASCII only, so Fortran readers and old tools see plain text.
    expect(/^[\x20-\x7e]*$/.test(where)).toBe(true);
  });

  it('the commented XYZ, extended XYZ and CIF still read back (ours, and gemmi for the CIF)', () => {
    for (const f of ['xyz', 'extxyz', 'cif'] as const) {
      const s = readStructure(exportFile(overlapping(), f).text);
      expect(s.species.length).toBe(5);
      expect(s.provenance.params).toEqual({ test: 'overlap' });
    }
    const n = runPython<number>(
      'import sys, json, gemmi\ntext = sys.stdin.read()\nst = gemmi.make_small_structure_from_block(gemmi.cif.read_string(text).sole_block())\nprint(json.dumps(len(st.sites)))',
      exportFile(overlapping(), 'cif').text,
    );
    expect(n).toBe(5);
  });

  it('a clean cut gets no check comment', () => {
    const s = overlapping();
    const clean: Structure = { ...s, positions: s.positions.slice(0, 12), species: s.species.slice(0, 4) };
    const { text, report } = exportFile(clean, 'poscar');
    expect(report.warnings).toEqual([]);
    expect(text.split('\n')[0]).toBe('Tauforge tauforge-engine/0.1.0 Al4');
  });
});
