/**
 * The quick reader of plain YAML (src/claims/yaml-plain.ts) against the yaml package (yaml 2, YAML 1.2 core schema,
 * the reference): whenever the quick reader takes a text, the yaml package must read it without error, to the same
 * data (keys in the same order, -0 kept apart from 0), and every place the quick reader records must be where the
 * yaml package's document puts that value and its key. Checked on every YAML file in the repository and on texts
 * drawn by fast-check from a grammar that mixes what the quick reader takes with what it must leave to yaml.
 */
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import fc from 'fast-check';
import { LineCounter, parseDocument } from 'yaml';
import { describe, expect, it } from 'vitest';
import { locate, type ParsedYaml } from '../../src/claims/yaml.js';
import { pathKey, readPlainYaml } from '../../src/claims/yaml-plain.js';

const root = resolve(__dirname, '../..');

/** The yaml package's reading of a text, parsed as src/claims/yaml.ts parses claims files. */
function reference(text: string): { errors: number; data: unknown; parsed: ParsedYaml } {
  const lines = new LineCounter();
  const doc = parseDocument(text, { lineCounter: lines, prettyErrors: false, merge: true, uniqueKeys: true });
  const data = doc.errors.length === 0 ? doc.toJS({ maxAliasCount: 1000 }) : undefined;
  return { errors: doc.errors.length, data, parsed: { doc, lines, text, data } };
}

/** Same data, in the same key order, with -0 and 0 told apart. */
function sameData(a: unknown, b: unknown): boolean {
  if (!isDeepStrictEqual(a, b)) return false;
  if (a !== null && typeof a === 'object') {
    const ka = Object.keys(a);
    const kb = Object.keys(b as object);
    if (ka.join('\u0000') !== kb.join('\u0000')) return false;
    return ka.every((k) => sameData((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]));
  }
  return true;
}

/** Compare the quick reading of `text` with the yaml package's; returns whether the quick reader took it. */
function check(text: string, name = 'text'): boolean {
  const quick = readPlainYaml(text);
  if (!quick) return false;
  const ref = reference(text);
  expect(ref.errors, `${name}: the quick reader took a text the yaml package refuses:\n${text}`).toBe(0);
  expect(sameData(quick.data, ref.data), `${name}: data differ:\n${text}\n${JSON.stringify(quick.data)}\n${JSON.stringify(ref.data)}`).toBe(true);
  const walk = (v: unknown, path: Array<string | number>): void => {
    const place = quick.places.get(pathKey(path));
    if (place) expect(place, `${name}: place of ${JSON.stringify(path)}:\n${text}`).toEqual(locate(ref.parsed, path));
    if (v !== null && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) walk(x, [...path, Array.isArray(v) ? Number(k) : k]);
    }
  };
  walk(quick.data, []);
  // Every non-empty value has a place.
  expect(quick.places.get(pathKey([]))).toBeDefined();
  return true;
}

describe('reading plain YAML quickly', () => {
  it('reads every YAML file in the repository as the yaml package does, or leaves it to yaml', () => {
    const files = execFileSync('git', ['ls-files', '*.yaml', '*.yml'], { cwd: root, encoding: 'utf8' }).trim().split('\n');
    let taken = 0;
    for (const f of files) if (check(readFileSync(join(root, f), 'utf8').replace(/^\uFEFF/, ''), f)) taken++;
    expect(taken).toBeGreaterThan(files.length / 2);
    // The demo (with a folded block scalar) is read quickly; a tab, two documents or a duplicated key are not.
    expect(readPlainYaml(readFileSync(join(root, 'demo/claims.yaml'), 'utf8'))).toBeDefined();
    expect(readPlainYaml('a: 1\n\tb: 2\n')).toBeUndefined();
    expect(readPlainYaml('a: 1\n---\nb: 2\n')).toBeUndefined();
    expect(readPlainYaml('a: 1\na: 2\n')).toBeUndefined();
    expect(readPlainYaml('a: &x 1\nb: *x\n')).toBeUndefined();
  });

  it('reads what the yaml package reads, on drawn texts', () => {
    const atoms = ['a', 'b', 'x y', ' ', '  ', '#', ' #', ':', ': ', '-', '- ', "'", '"', '\\', ',', '[', ']', '{', '}', '&', '*', '!', '|', '>', '%', '@', '`', '?', '.', '0', '1', '9', 'e', 'E', '+', 'x', 'o', 'ŵ', '\u00a0', '😀', 'true', 'False', 'NULL', '~', 'null', '0x1F', '0o17', '.5', '1.', '-0', '1e3', '.inf', '.nan', '2026-03-04', '95%', 'latest'];
    const scalarText = fc.array(fc.constantFrom(...atoms), { minLength: 0, maxLength: 4 }).map((a) => a.join(''));
    const scalar = fc.oneof(
      scalarText,
      scalarText.map((s) => `'${s.replace(/'/g, "''")}'`),
      scalarText.map((s) => `"${s}"`),
      fc.constantFrom('1', '-2', '3.5', '1e-3', 'true', '~', '', 'null', '0o7', '0x1f', '+4', '007', '1_000'),
    );
    const key = fc.oneof(fc.constantFrom('id', 'claim', 'where', 'a b', 'x-y', '1', 'true', 'null', '~', '1.0', 'ŵŷ', 'constructor', 'k"q', '<<', '__proto__', '-k', '?k', 'k#'), scalarText.filter((s) => s.length > 0), scalarText.map((s) => `"${s}"`));
    const comment = fc.constantFrom('', '', ' # note', '  #', ' #: x');
    type Tree = { kind: 'scalar'; text: string } | { kind: 'map'; entries: Array<[string, Tree]>; flow: boolean } | { kind: 'seq'; items: Tree[]; flow: boolean; sameIndent: boolean } | { kind: 'block'; header: string; lines: string[] };
    const { tree } = fc.letrec<{ tree: Tree }>((tie) => ({
      tree: fc.oneof(
        { depthSize: 'small', withCrossShrink: true },
        scalar.map((text) => ({ kind: 'scalar' as const, text })),
        fc.record({ kind: fc.constant('map' as const), entries: fc.array(fc.tuple(key, tie('tree')), { minLength: 1, maxLength: 3 }), flow: fc.boolean() }),
        fc.record({ kind: fc.constant('seq' as const), items: fc.array(tie('tree'), { minLength: 1, maxLength: 3 }), flow: fc.boolean(), sameIndent: fc.boolean() }),
        fc.record({ kind: fc.constant('block' as const), header: fc.constantFrom('>', '>-', '|', '|-', '>+', '|2'), lines: fc.array(fc.oneof(scalarText, fc.constant(''), scalarText.map((s) => ` ${s}`), scalarText.map((s) => `# ${s}`)), { minLength: 1, maxLength: 4 }) }),
      ),
    }));
    const flow = (t: Tree): string =>
      t.kind === 'scalar' ? t.text : t.kind === 'map' ? `{ ${t.entries.map(([k, v]) => `${k}: ${flow(v)}`).join(', ')} }` : t.kind === 'seq' ? `[${t.items.map(flow).join(', ')}]` : 'x';
    /** Lines for the value of a key at column `col` (or a list item), after "key:" on the same line. */
    const render = (t: Tree, col: number, extra: string[]): { inline: string; below: string[] } => {
      const pad = ' '.repeat(col + 2);
      if (t.kind === 'scalar') return { inline: ` ${t.text}`, below: [] };
      if (t.kind === 'block') return { inline: ` ${t.header}`, below: t.lines.map((l) => (l === '' ? '' : pad + l)) };
      if (t.flow) return { inline: ` ${flow(t)}`, below: [] };
      if (t.kind === 'map') return { inline: '', below: mapLines(t, col + 2, extra) };
      const at = t.sameIndent ? col : col + 2;
      return { inline: '', below: t.items.flatMap((item) => itemLines(item, at, extra)) };
    };
    const itemLines = (t: Tree, col: number, extra: string[]): string[] => {
      const dash = `${' '.repeat(col)}- `;
      if (t.kind === 'map' && !t.flow) {
        const lines = mapLines(t, col + 2, extra);
        return [dash + lines[0]!.slice(col + 2), ...lines.slice(1)];
      }
      const r = render(t, col, extra);
      return [`${dash}${r.inline.trimStart()}`, ...r.below];
    };
    const mapLines = (t: Extract<Tree, { kind: 'map' }>, col: number, extra: string[]): string[] =>
      t.entries.flatMap(([k, v], i) => {
        const r = render(v, col, extra);
        return [`${' '.repeat(col)}${k}:${r.inline}${extra[i % extra.length] ?? ''}`, ...r.below, ...(i % 2 ? [''] : [])];
      });
    let taken = 0;
    let runs = 0;
    fc.assert(
      fc.property(fc.array(fc.tuple(key, tree), { minLength: 1, maxLength: 4 }), fc.array(comment, { minLength: 1, maxLength: 3 }), (entries, extra) => {
        runs++;
        const text = `${mapLines({ kind: 'map', entries, flow: false }, 0, extra).join('\n')}\n`;
        if (check(text)) taken++;
      }),
      { numRuns: 3000 },
    );
    // The drawn texts reach the quick reader often enough for the comparison to mean something.
    expect(taken).toBeGreaterThan(runs / 20);
  });
});
