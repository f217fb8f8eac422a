import { ENGINE_VERSION } from '../version';
import { MAX_Z, symbolOf, tryAtomicNumber } from '../structure/elements';
import type { Structure } from '../structure/types';
import { validateStructure } from '../structure/validate';
import { FormatError, splitLines } from './errors';
import { canonicalJson } from './canonical-json';
import { fixed, parseNumber } from './number';

const COMMENT_PREFIX = 'Tauforge';

/**
 * Standard XYZ: atom count, one comment line, then `El x y z` per atom (Å, 8 decimals).
 * The comment line carries the engine version and the generating params as compact JSON:
 * `Tauforge <engine> params=<json>` so a file records how it was made. Unassigned vertices
 * (species 0) are written as element X, the common practice for dummy atoms.
 */
export function writeXyz(s: Structure, opts: { check?: string } = {}): string {
  validateStructure(s);
  const n = s.species.length;
  const out: string[] = [String(n), xyzComment(s, opts.check)];
  const p = s.positions;
  for (let i = 0; i < n; i++) {
    out.push(`${symbolOf(s.species[i]).padEnd(2)} ${fixed(p[3 * i])} ${fixed(p[3 * i + 1])} ${fixed(p[3 * i + 2])}`);
  }
  return out.join('\n') + '\n';
}

/**
 * `Tauforge <engine> [check="<warnings>"] params=<json>`: the check's warnings, when given, travel in the comment
 * line as a quoted value (backslash and double quote escaped) before params, so the params stay last and readable.
 */
function xyzComment(s: Structure, check?: string): string {
  const c = check ? ` check="${check.replace(/[\r\n]+/g, ' ').replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"` : '';
  return `${COMMENT_PREFIX} ${s.provenance.engine || ENGINE_VERSION}${c} params=${canonicalJson(s.provenance.params ?? null)}`;
}

/** Parse the species column: an element symbol (case-insensitive) or an atomic number. */
export function parseSpeciesToken(format: string, token: string, line: number): number {
  if (/^\d+$/.test(token)) {
    const z = Number(token);
    if (z > MAX_Z) throw new FormatError(format, `atomic number ${z} is out of range 0..${MAX_Z}`, line);
    return z;
  }
  const z = tryAtomicNumber(token);
  if (z === undefined) throw new FormatError(format, `unknown element "${token}"`, line);
  return z;
}

/**
 * Read the first frame of a standard XYZ file. Extra columns after x y z are ignored; further frames
 * are ignored. The provenance records our own comment line's params when present, else the comment.
 */
export function readXyz(text: string): Structure {
  const lines = splitLines(text);
  let first = 0;
  while (first < lines.length && lines[first].trim() === '') first++;
  if (first >= lines.length) throw new FormatError('XYZ', 'the file is empty');
  const countTok = lines[first].trim().split(/\s+/)[0];
  if (!/^\d+$/.test(countTok)) {
    throw new FormatError('XYZ', `expected the number of atoms, found "${lines[first].trim()}"`, first + 1);
  }
  const n = Number(countTok);
  if (first + 1 >= lines.length) throw new FormatError('XYZ', 'missing comment line', first + 2);
  const comment = lines[first + 1];
  const available = lines.length - (first + 2);
  if (available < n) {
    throw new FormatError(
      'XYZ',
      `the count line says ${n} atoms but only ${Math.max(0, available)} atom lines follow`,
      lines.length + 1,
    );
  }
  const positions = new Float64Array(3 * n);
  const species = new Uint16Array(n);
  for (let i = 0; i < n; i++) {
    const ln = first + 3 + i;
    const tok = lines[ln - 1].trim().split(/\s+/);
    if (tok.length < 4 || tok[0] === '') {
      throw new FormatError('XYZ', `expected "element x y z", found "${lines[ln - 1].trim()}"`, ln);
    }
    species[i] = parseSpeciesToken('XYZ', tok[0], ln);
    for (let k = 0; k < 3; k++) {
      const v = parseNumber(tok[k + 1]);
      if (!Number.isFinite(v)) {
        throw new FormatError('XYZ', `coordinate ${'xyz'[k]} "${tok[k + 1]}" is not a number`, ln);
      }
      positions[3 * i + k] = v;
    }
  }
  return { positions, species, provenance: provenanceFromComment(comment, 'xyz') };
}

/** Recover params from our own comment line, or describe the file. */
export function provenanceFromComment(comment: string, format: string): Structure['provenance'] {
  const m = /^Tauforge (\S+)(?: check="(?:[^"\\]|\\.)*")? params=(.*)$/.exec(comment.trim());
  if (m) {
    try {
      return { engine: m[1], params: JSON.parse(m[2]) };
    } catch {
      // fall through: not our comment after all
    }
  }
  return { engine: ENGINE_VERSION, params: { source: format, comment: comment.trim() } };
}
