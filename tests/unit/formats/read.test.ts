import { describe, expect, it } from 'vitest';
import { readStructure, sniffFormat, writeCif, writeExtxyz, writeJson, writeXyz } from '@/lib/formats';
import type { Structure } from '@/lib/structure';

const s: Structure = {
  positions: new Float64Array([0, 0, 0, 1, 1, 1]),
  species: new Uint16Array([13, 25]),
  cell: [
    [5, 0, 0],
    [0, 5, 0],
    [0, 0, 5],
  ],
  provenance: { engine: 'tauforge-engine/0.1.0', params: { k: 1 } },
};

describe('readStructure sniffs the format', () => {
  it('recognises each writer’s output', () => {
    expect(sniffFormat(writeXyz(s))).toBe('xyz');
    expect(sniffFormat(writeExtxyz(s))).toBe('extxyz');
    expect(sniffFormat(writeCif(s))).toBe('cif');
    expect(sniffFormat(writeJson(s))).toBe('json');
    expect(sniffFormat('2\n\nAl 0 0 0\nAl 1 1 1\n', 'a.extxyz')).toBe('extxyz');
    for (const w of [writeXyz, writeExtxyz, writeCif, writeJson]) {
      const r = readStructure(w(s));
      expect(Array.from(r.species)).toEqual([13, 25]);
      expect(r.positions[5]).toBeCloseTo(1, 8);
    }
  });

  it('says so when it cannot tell', () => {
    expect(() => readStructure('hello world')).toThrow(/cannot tell the format/);
  });
});
