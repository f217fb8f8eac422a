/**
 * Reader for an uploaded measured powder pattern: two (or three: x, I, σ) columns per line.
 *
 * - x is 2θ in degrees, |Q| in Å⁻¹ (|Q| = 4π sinθ/λ = 2π/d) or d in Å; which one comes from the
 *   header (a first non-comment line with words such as "2theta", "q", "d") or from `opts.axis`
 *   (default 2θ).
 * - Columns are separated by whitespace, commas, semicolons or tabs; lines starting with # or ; are
 *   comments; blank lines are skipped.
 * - Points are returned sorted by ascending x. Every bad line is reported by its 1-based number.
 */
import { FormatError, splitLines } from './errors';

export type MeasuredAxis = '2theta' | 'q' | 'd';

export interface MeasuredPattern {
  axis: MeasuredAxis;
  x: Float64Array;
  intensity: Float64Array;
  /** Third column when present (standard uncertainty of the intensity). */
  sigma?: Float64Array;
  /** Header words as read, when a header line was present. */
  header?: string[];
  /** Comment lines, without their # or ; marker. */
  comments: string[];
}

const FORMAT = 'measured pattern';
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

function axisFromWord(w: string): MeasuredAxis | undefined {
  const t = w.toLowerCase().replace(/[()[\]°]/g, '');
  if (/^(2theta|2-theta|two_?theta|twotheta|2θ|2th|tth|angle|2thetadeg|deg)$/.test(t)) return '2theta';
  if (/^(q|qa-1|q1\/a|q_a-1|qinva|q\/a-1)$/.test(t) || t.startsWith('q')) return 'q';
  if (/^(d|da|d_a|dspacing|d-spacing|d_spacing)$/.test(t)) return 'd';
  return undefined;
}

export function readMeasured(text: string, opts: { axis?: MeasuredAxis } = {}): MeasuredPattern {
  const lines = splitLines(text);
  const xs: number[] = [];
  const ys: number[] = [];
  const ss: number[] = [];
  const comments: string[] = [];
  let header: string[] | undefined;
  let columns = 0;
  for (let i = 0; i < lines.length; i++) {
    const lineNo = i + 1;
    const raw = lines[i].trim();
    if (raw === '') continue;
    if (raw.startsWith('#') || raw.startsWith(';')) {
      comments.push(raw.slice(1).trim());
      continue;
    }
    const tokens = raw.split(/[\s,;]+/).filter((t) => t !== '');
    const numeric = tokens.map((t) => NUMBER.test(t));
    if (!numeric.every(Boolean)) {
      if (xs.length === 0 && header === undefined && !numeric.some(Boolean)) {
        header = tokens;
        continue;
      }
      const bad = tokens[numeric.indexOf(false)];
      throw new FormatError(FORMAT, `"${bad}" is not a number (expected x and intensity columns)`, lineNo);
    }
    if (tokens.length < 2) throw new FormatError(FORMAT, `expected two columns (x and intensity), found ${tokens.length}`, lineNo);
    if (tokens.length > 3) throw new FormatError(FORMAT, `expected two or three columns, found ${tokens.length}`, lineNo);
    if (columns === 0) columns = tokens.length;
    else if (tokens.length !== columns) {
      throw new FormatError(FORMAT, `found ${tokens.length} columns where earlier lines have ${columns}`, lineNo);
    }
    const v = tokens.map(Number);
    if (!v.every(Number.isFinite)) throw new FormatError(FORMAT, 'number out of range', lineNo);
    xs.push(v[0]);
    ys.push(v[1]);
    if (columns === 3) {
      if (!(v[2] > 0)) throw new FormatError(FORMAT, `uncertainty must be positive, got ${tokens[2]}`, lineNo);
      ss.push(v[2]);
    }
  }
  if (xs.length < 2) throw new FormatError(FORMAT, `need at least two data points, found ${xs.length}`);
  let axis: MeasuredAxis = opts.axis ?? '2theta';
  if (header && !opts.axis) axis = axisFromWord(header[0]) ?? '2theta';
  const order = xs.map((_, i) => i).sort((a, b) => xs[a] - xs[b]);
  for (let i = 1; i < order.length; i++) {
    if (xs[order[i]] === xs[order[i - 1]]) {
      throw new FormatError(FORMAT, `x = ${xs[order[i]]} appears twice`);
    }
  }
  for (const i of order) {
    const x = xs[i];
    if (axis === '2theta' && !(x > 0 && x < 180)) throw new FormatError(FORMAT, `2θ = ${x} is outside (0, 180) degrees`, lineOf(lines, i));
    if (axis !== '2theta' && !(x > 0)) throw new FormatError(FORMAT, `${axis} = ${x} must be positive`, lineOf(lines, i));
  }
  return {
    axis,
    x: Float64Array.from(order, (i) => xs[i]),
    intensity: Float64Array.from(order, (i) => ys[i]),
    sigma: columns === 3 ? Float64Array.from(order, (i) => ss[i]) : undefined,
    header,
    comments,
  };
}

/** 1-based line number of the k-th data line (for errors found after parsing). */
function lineOf(lines: string[], k: number): number | undefined {
  let seen = -1;
  let headerSeen = false;
  for (let i = 0; i < lines.length; i++) {
    const t = lines[i].trim();
    if (t === '' || t.startsWith('#') || t.startsWith(';')) continue;
    if (!headerSeen && seen === -1 && !/^[+-]?[\d.]/.test(t)) {
      headerSeen = true;
      continue;
    }
    seen++;
    if (seen === k) return i + 1;
  }
  return undefined;
}
