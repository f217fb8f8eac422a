/**
 * Structure checks on the source tree (common practice for keeping a layered code base honest; they check
 * the layout, not the science):
 * (a) no runtime import cycle among app/, components/, lib/ and scripts/ — `import type`, `export type` and
 *     imports whose every name is marked `type` are erased by the compiler and do not count; a lazy
 *     `import()` does not count either, since it runs after every module has loaded;
 * (b) lib/ outside lib/server and lib/auth runs in a Web Worker and in the browser as well as on the server
 *     (DEVELOPERS.md), so it imports no Node built-in (node:*, fs, path, child_process, worker_threads, …)
 *     and never touches the page globals `window` or `document`;
 * (c) tests/unit mirrors lib/: every file in tests/unit/<folder>/… has the folder lib/<folder>/… beside
 *     it, except the command line (tests/unit/cli) and the React pieces (tests/unit/components); the only
 *     file directly in tests/unit is this one.
 * Imports are read with the TypeScript parser (the compiler's own view of the syntax), not with regexes,
 * so comments, strings and property names such as `x.window` are never mistaken for code.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = fileURLToPath(new URL('../..', import.meta.url));
const LAYERS = ['app', 'components', 'lib', 'scripts'];
const SOURCE = /\.(ts|tsx|mts|mjs|js)$/;
const rel = (p: string) => relative(ROOT, p).split(sep).join('/');

function walk(dir: string, out: string[] = []): string[] {
  for (const name of readdirSync(dir)) {
    if (name === 'node_modules' || name.startsWith('.')) continue;
    const p = join(dir, name);
    if (statSync(p).isDirectory()) walk(p, out);
    else out.push(p);
  }
  return out;
}

const parse = (file: string) => ts.createSourceFile(file, readFileSync(file, 'utf8'), ts.ScriptTarget.Latest, true, file.endsWith('x') ? ts.ScriptKind.TSX : ts.ScriptKind.TS);

/** Module specifiers a file loads when it runs (static imports and re-exports that survive type erasure). */
function runtimeImports(sf: ts.SourceFile): string[] {
  const out: string[] = [];
  for (const st of sf.statements) {
    if (ts.isImportDeclaration(st) && ts.isStringLiteral(st.moduleSpecifier)) {
      const c = st.importClause;
      if (c?.isTypeOnly) continue;
      const named = c?.namedBindings;
      const onlyTypeNames = !!c && !c.name && !!named && ts.isNamedImports(named) && named.elements.length > 0 && named.elements.every((e) => e.isTypeOnly);
      if (!onlyTypeNames) out.push(st.moduleSpecifier.text);
    } else if (ts.isExportDeclaration(st) && st.moduleSpecifier && ts.isStringLiteral(st.moduleSpecifier)) {
      if (st.isTypeOnly) continue;
      const e = st.exportClause;
      if (e && ts.isNamedExports(e) && e.elements.length > 0 && e.elements.every((x) => x.isTypeOnly)) continue;
      out.push(st.moduleSpecifier.text);
    } else if (ts.isImportEqualsDeclaration(st) && !st.isTypeOnly && ts.isExternalModuleReference(st.moduleReference) && ts.isStringLiteral(st.moduleReference.expression)) {
      out.push(st.moduleReference.expression.text);
    }
  }
  return out;
}

/** Every module specifier in a file, type-only and lazy ones included (for the built-in check). */
function allSpecifiers(sf: ts.SourceFile): string[] {
  const out: string[] = [];
  const visit = (n: ts.Node) => {
    if ((ts.isImportDeclaration(n) || ts.isExportDeclaration(n)) && n.moduleSpecifier && ts.isStringLiteral(n.moduleSpecifier)) out.push(n.moduleSpecifier.text);
    else if (ts.isCallExpression(n) && n.arguments.length > 0 && ts.isStringLiteral(n.arguments[0]) && (n.expression.kind === ts.SyntaxKind.ImportKeyword || (ts.isIdentifier(n.expression) && n.expression.text === 'require')))
      out.push(n.arguments[0].text);
    else if (ts.isImportTypeNode(n) && ts.isLiteralTypeNode(n.argument) && ts.isStringLiteral(n.argument.literal)) out.push(n.argument.literal.text);
    ts.forEachChild(n, visit);
  };
  visit(sf);
  return out;
}

/** The project file a specifier names (relative or `@/`), or null for a package or a built-in. */
function resolveLocal(from: string, spec: string): string | null {
  let base: string;
  if (spec.startsWith('@/')) base = join(ROOT, spec.slice(2));
  else if (spec.startsWith('.')) base = resolve(dirname(from), spec);
  else return null;
  const tries = [base, ...['.ts', '.tsx', '.mts', '.mjs', '.js'].map((x) => base + x), ...['index.ts', 'index.tsx', 'index.mjs'].map((x) => join(base, x))];
  // `./a.js` written for `./a.ts` (ESM style)
  if (/\.m?js$/.test(base)) tries.push(base.replace(/\.m?js$/, '.ts'), base.replace(/\.m?js$/, '.tsx'));
  for (const t of tries) if (existsSync(t) && statSync(t).isFile()) return t;
  throw new Error(`${rel(from)}: cannot resolve import "${spec}"`);
}

/** Strongly connected components with more than one file, or a file importing itself (Tarjan 1972). */
function cycles(graph: Map<string, string[]>): string[][] {
  let index = 0;
  const idx = new Map<string, number>();
  const low = new Map<string, number>();
  const stack: string[] = [];
  const on = new Set<string>();
  const out: string[][] = [];
  const strong = (v: string) => {
    idx.set(v, index);
    low.set(v, index++);
    stack.push(v);
    on.add(v);
    for (const w of graph.get(v) ?? []) {
      if (!idx.has(w)) {
        strong(w);
        low.set(v, Math.min(low.get(v)!, low.get(w)!));
      } else if (on.has(w)) low.set(v, Math.min(low.get(v)!, idx.get(w)!));
    }
    if (low.get(v) === idx.get(v)) {
      const comp: string[] = [];
      let w: string;
      do {
        w = stack.pop()!;
        on.delete(w);
        comp.push(w);
      } while (w !== v);
      if (comp.length > 1 || (graph.get(v) ?? []).includes(v)) out.push(comp.map(rel).sort());
    }
  };
  for (const v of graph.keys()) if (!idx.has(v)) strong(v);
  return out;
}

const files = LAYERS.flatMap((d) => walk(join(ROOT, d))).filter((f) => SOURCE.test(f) && !f.endsWith('.d.ts'));
const parsed = new Map(files.map((f) => [f, parse(f)]));

describe('architecture (structure checks, common practice)', () => {
  it('reads the whole tree (app, components, lib, scripts) and sees its imports', () => {
    // Guards the checks below against passing on an empty or mis-read tree.
    for (const d of LAYERS) expect(files.some((f) => rel(f).startsWith(`${d}/`)), d).toBe(true);
    let edges = 0;
    for (const [f, sf] of parsed) for (const s of runtimeImports(sf)) if (resolveLocal(f, s)) edges++;
    expect(edges).toBeGreaterThan(files.length);
  });

  it('(a) has no runtime import cycle among app/, components/, lib/ and scripts/', () => {
    const graph = new Map<string, string[]>();
    for (const [f, sf] of parsed) graph.set(f, runtimeImports(sf).map((s) => resolveLocal(f, s)).filter((t): t is string => t !== null && parsed.has(t)));
    expect(cycles(graph)).toEqual([]);
  });

  it('(a) the cycle finder itself finds a cycle of three and a self-import, and ignores type-only imports', () => {
    const g = new Map([
      ['a', ['b']],
      ['b', ['c']],
      ['c', ['a', 'd']],
      ['d', []],
      ['e', ['e']],
    ]);
    expect(cycles(g).map((c) => c.join(' ')).sort()).toEqual(['a b c', 'e']);
    const sf = ts.createSourceFile(
      'x.ts',
      "import type { A } from './a';\nimport { type B } from './b';\nimport { type C, d } from './c';\nexport type { E } from './e';\nexport * from './f';\nimport './g';\nconst h = () => import('./h');",
      ts.ScriptTarget.Latest,
      true,
    );
    expect(runtimeImports(sf)).toEqual(['./c', './f', './g']);
  });

  it('(b) lib/ outside lib/server and lib/auth imports no Node built-in and does not touch window or document', () => {
    const builtins = new Set(builtinModules.flatMap((m) => [m, `node:${m}`]));
    const isBuiltin = (s: string) => s.startsWith('node:') || builtins.has(s) || builtins.has(s.split('/')[0]);
    const portable = files.filter((f) => {
      const r = rel(f);
      return r.startsWith('lib/') && !r.startsWith('lib/server/') && !r.startsWith('lib/auth/');
    });
    expect(portable.length).toBeGreaterThan(50);
    const bad: string[] = [];
    for (const f of portable) {
      const sf = parsed.get(f)!;
      for (const s of allSpecifiers(sf)) if (isBuiltin(s)) bad.push(`${rel(f)}: imports ${s}`);
      const visit = (n: ts.Node) => {
        if (ts.isIdentifier(n) && (n.text === 'window' || n.text === 'document')) {
          const p = n.parent;
          // `x.window`, `{ window: 1 }`, `interface { window: … }` name a property, not the global.
          const propertyName =
            (ts.isPropertyAccessExpression(p) && p.name === n) ||
            ((ts.isPropertyAssignment(p) || ts.isPropertySignature(p) || ts.isPropertyDeclaration(p) || ts.isMethodDeclaration(p) || ts.isMethodSignature(p)) && p.name === n) ||
            (ts.isQualifiedName(p) && p.right === n);
          if (!propertyName) bad.push(`${rel(f)}:${sf.getLineAndCharacterOfPosition(n.getStart()).line + 1}: uses ${n.text}`);
        }
        ts.forEachChild(n, visit);
      };
      visit(sf);
    }
    expect(bad).toEqual([]);
  });

  it('(c) every file under tests/unit sits in a folder that lib/ has too, or under tests/unit/cli or tests/unit/components', () => {
    const unit = join(ROOT, 'tests', 'unit');
    const all = walk(unit).map((f) => relative(unit, f).split(sep).join('/'));
    expect(all.length).toBeGreaterThan(40);
    const stray = all.filter((f) => {
      const parts = f.split('/');
      if (parts.length === 1) return f !== 'architecture.test.ts';
      if (parts[0] === 'cli' || parts[0] === 'components') return false;
      const folder = join(ROOT, 'lib', ...parts.slice(0, -1));
      return !(existsSync(folder) && statSync(folder).isDirectory());
    });
    expect(stray).toEqual([]);
  });
});
