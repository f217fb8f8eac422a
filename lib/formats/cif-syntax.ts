import { FormatError } from './errors';

/** One CIF value with the 1-based line it came from. null value for '?' (unknown) and '.' (not applicable). */
export interface CifValue {
  text: string;
  line: number;
  /** true when the value was quoted or a text field (so '?' and '.' are literal). */
  quoted: boolean;
}

export interface CifLoop {
  tags: string[];
  rows: CifValue[][];
  line: number;
}

export interface CifBlock {
  name: string;
  line: number;
  /** Lower-cased tag → value for tags outside loops. */
  items: Map<string, CifValue>;
  loops: CifLoop[];
}

interface Token extends CifValue {
  kind: 'word' | 'value';
}

const F = 'CIF';

/** Split CIF 1.1 text into tokens: bare words, 'quoted' / "quoted" strings, ;text fields;, skipping # comments. */
function tokenize(text: string): Token[] {
  const lines = text.split(/\r\n|\r|\n/);
  const out: Token[] = [];
  for (let li = 0; li < lines.length; li++) {
    const line = lines[li];
    const ln = li + 1;
    if (line.startsWith(';')) {
      const parts = [line.slice(1)];
      let end = li + 1;
      while (end < lines.length && !lines[end].startsWith(';')) parts.push(lines[end++]);
      if (end >= lines.length) throw new FormatError(F, 'text field opened with ";" is never closed', ln);
      out.push({ kind: 'value', text: parts.join('\n').replace(/^\n/, ''), line: ln, quoted: true });
      // anything after the closing ';' on the same line is tokenized as usual
      lines[end] = lines[end].slice(1);
      li = end - 1;
      continue;
    }
    let i = 0;
    while (i < line.length) {
      const c = line[i];
      if (c === ' ' || c === '\t') {
        i++;
        continue;
      }
      if (c === '#') break;
      if (c === "'" || c === '"') {
        // CIF 1.1: a quote closes the string only when followed by whitespace or end of line.
        let j = i + 1;
        while (j < line.length && !(line[j] === c && (j + 1 === line.length || /\s/.test(line[j + 1])))) j++;
        if (j >= line.length) throw new FormatError(F, `unterminated ${c}quoted${c} value`, ln);
        out.push({ kind: 'value', text: line.slice(i + 1, j), line: ln, quoted: true });
        i = j + 1;
        continue;
      }
      let j = i;
      while (j < line.length && line[j] !== ' ' && line[j] !== '\t') j++;
      out.push({ kind: 'word', text: line.slice(i, j), line: ln, quoted: false });
      i = j;
    }
  }
  return out;
}

/** Parse CIF 1.1 syntax into data blocks (save frames and global_ blocks are rejected). */
export function parseCif(text: string): CifBlock[] {
  const toks = tokenize(text);
  const blocks: CifBlock[] = [];
  let block: CifBlock | undefined;
  let i = 0;
  const isKeyword = (t: Token) =>
    t.kind === 'word' && (t.text.startsWith('_') || /^(data_|loop_$|save_|global_$|stop_$)/i.test(t.text));
  while (i < toks.length) {
    const t = toks[i];
    const low = t.text.toLowerCase();
    if (t.kind === 'word' && low.startsWith('data_')) {
      block = { name: t.text.slice(5), line: t.line, items: new Map(), loops: [] };
      blocks.push(block);
      i++;
      continue;
    }
    if (t.kind === 'word' && (low.startsWith('save_') || low === 'global_' || low === 'stop_')) {
      throw new FormatError(F, `"${t.text}" (save frames / global blocks) is not supported`, t.line);
    }
    if (!block) throw new FormatError(F, `expected "data_<name>" before "${t.text}"`, t.line);
    if (t.kind === 'word' && low === 'loop_') {
      const loop: CifLoop = { tags: [], rows: [], line: t.line };
      i++;
      while (i < toks.length && toks[i].kind === 'word' && toks[i].text.startsWith('_')) {
        loop.tags.push(toks[i].text.toLowerCase());
        i++;
      }
      if (loop.tags.length === 0) throw new FormatError(F, 'loop_ without any _tags', t.line);
      const values: CifValue[] = [];
      while (i < toks.length && !isKeyword(toks[i])) values.push(toks[i++]);
      if (values.length % loop.tags.length !== 0) {
        const last = values[values.length - 1] ?? t;
        throw new FormatError(
          F,
          `loop of ${loop.tags.length} tags (${loop.tags[0]} …) holds ${values.length} values, not a multiple of ${loop.tags.length}`,
          last.line,
        );
      }
      for (let k = 0; k < values.length; k += loop.tags.length) loop.rows.push(values.slice(k, k + loop.tags.length));
      block.loops.push(loop);
      continue;
    }
    if (t.kind === 'word' && t.text.startsWith('_')) {
      const v = toks[i + 1];
      if (!v || isKeyword(v)) throw new FormatError(F, `tag ${t.text} has no value`, t.line);
      block.items.set(low, v);
      i += 2;
      continue;
    }
    throw new FormatError(F, `unexpected value "${t.text}" outside a loop`, t.line);
  }
  return blocks;
}

/** Numeric value of a CIF number, dropping a standard uncertainty "1.234(5)"; NaN for '?', '.', or junk. */
export function cifNumber(v: CifValue | undefined): number {
  if (!v || (!v.quoted && (v.text === '?' || v.text === '.'))) return NaN;
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)(?:\(\d+\))?$/.exec(v.text);
  return m ? Number(m[1]) : NaN;
}

/** Find the loop that holds a tag (lower case), with the column index. */
export function findLoop(block: CifBlock, tag: string): { loop: CifLoop; col: number } | undefined {
  for (const loop of block.loops) {
    const col = loop.tags.indexOf(tag);
    if (col >= 0) return { loop, col };
  }
  return undefined;
}
