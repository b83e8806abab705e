/**
 * YAML text -> plain data, keeping the parsed document so that any value can be traced back to its line and column.
 * YAML syntax errors become problems in plain words with the parser's own reason attached.
 */
import { createRequire } from 'node:module';
import type { Document, LineCounter, Node, ParsedNode } from 'yaml';
import type { Problem } from '../errors.js';
import type { Place } from './types.js';
import { pathKey, readPlainYaml, type QuickPlace } from './yaml-plain.js';

/**
 * The yaml package, loaded when first needed: a claims file in plain YAML is read by yaml-plain.ts, and the package
 * (about 0.04 s to load) only when the file uses more of YAML, has a mistake, or a place is asked for that the quick
 * reader did not record.
 */
let yamlPackage: typeof import('yaml') | undefined;
function Y(): typeof import('yaml') {
  yamlPackage ??= createRequire(import.meta.url)('yaml') as typeof import('yaml');
  return yamlPackage;
}

/** Guard against alias bombs ("billion laughs"): at most this many values may be produced through aliases. */
export const MAX_ALIAS_COUNT = 1000;

export interface ParsedYaml {
  /** The parsed document (parsed on first use when the quick reader read the file). */
  readonly doc: Document.Parsed;
  readonly lines: LineCounter;
  text: string;
  data: unknown;
  /** Places of the values, when the quick reader read the file (yaml-plain.ts). */
  places?: Map<string, QuickPlace>;
}

/** The options every claims file is parsed with. */
function parseWhole(text: string): { doc: Document.Parsed; lines: LineCounter } {
  const lines = new (Y().LineCounter)();
  const doc = Y().parseDocument(text, { lineCounter: lines, prettyErrors: false, merge: true, uniqueKeys: true });
  return { doc, lines };
}

export type YamlOutcome = { ok: true; parsed: ParsedYaml } | { ok: false; problems: Problem[] };

/** Plain-words reasons and fixes for the parser's error codes. */
const SYNTAX: Record<string, { problem: string; fix: string }> = {
  TAB_AS_INDENT: {
    problem: 'a tab is used for indenting, which YAML does not allow',
    fix: 'Indent with spaces only (two per level is usual)',
  },
  BAD_INDENT: {
    problem: 'this line is not indented in line with the lines around it',
    fix: 'Line it up with the other keys at the same level, using spaces',
  },
  BLOCK_AS_IMPLICIT_KEY: {
    problem: 'this line is indented as if it belonged to the key before it, but that key already has a value on its own line',
    fix: 'Line the key up with the one above it, or move the value of the key above onto lines of its own',
  },
  MULTILINE_IMPLICIT_KEY: {
    problem: 'a key runs over more than one line, usually because a colon or an indent is missing on the line before',
    fix: 'Check that every key on the lines above is followed by a colon and a space, and that indents line up',
  },
  DUPLICATE_KEY: {
    problem: 'the same key is written twice in one mapping',
    fix: 'Keep one of the two lines and delete the other',
  },
  BAD_DQ_ESCAPE: {
    problem: 'a backslash inside double quotes starts an escape sequence YAML does not know',
    fix: "Use single quotes around this value, or write each backslash twice",
  },
  BAD_SCALAR_START: {
    problem: 'a value starts with a character that YAML reserves (such as @, ` or %)',
    fix: 'Put the value in quotes',
  },
  MULTIPLE_DOCS: {
    problem: 'the file holds more than one YAML document (there is a line with --- after the content started)',
    fix: 'Keep a single document: delete the second --- line, or move the claims into one file',
  },
  BAD_ALIAS: {
    problem: 'an alias (*name) refers to an anchor (&name) that is not defined before it',
    fix: 'Define the anchor with &name before using *name, or write the value out in full',
  },
  MISSING_CHAR: {
    problem: 'a bracket, quote, comma or colon is missing',
    fix: 'Close every [ with ], every { with }, every quote with a matching quote, and put ": " after each key',
  },
  UNEXPECTED_TOKEN: {
    problem: 'something here does not fit the structure around it',
    fix: 'Check the indentation, colons and quotes on this line and the line before',
  },
  RESOURCE_EXHAUSTION: {
    problem: 'the file nests brackets or lists too deeply to be read',
    fix: 'Write the claims file as plain keys and lists, nested a few levels at most',
  },
  KEY_OVER_1024_CHARS: {
    problem: 'a key is longer than 1024 characters',
    fix: 'Shorten the key; long text belongs in a value',
  },
};
const SYNTAX_DEFAULT = {
  problem: 'this is not valid YAML',
  fix: 'Check the indentation, colons and quotes on this line and the line before',
};

function placeOf(lines: LineCounter, offset: number): Place {
  const { line, col } = lines.linePos(offset);
  return { line: Math.max(1, line), column: Math.max(1, col) };
}

/** Brackets ([ and {) nested deeper than this are refused before the YAML reader sees them. */
const MAX_FLOW_DEPTH = 200;

/**
 * The offset of the first [ or { nested deeper than MAX_FLOW_DEPTH, or undefined. Quoted text and comments are passed
 * over (a quote counts where a value can start: after a space, a bracket, a comma or a colon, or at a line's start);
 * a claims file nests a few levels, so a rough count cannot mistake one for a file nested hundreds deep.
 */
function tooDeep(text: string): number | undefined {
  let depth = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 91 || c === 123) {
      if (++depth > MAX_FLOW_DEPTH) return i;
    } else if (c === 93 || c === 125) {
      if (depth > 0) depth--;
    } else if (c === 34 || c === 39 || c === 35) {
      const prev = i === 0 ? 10 : text.charCodeAt(i - 1);
      // 32 space, 9 tab, 10 line break, 91 [, 123 {, 44 comma, 58 colon
      const starts = prev === 32 || prev === 9 || prev === 10 || prev === 13 || (c !== 35 && (prev === 91 || prev === 123 || prev === 44 || prev === 58));
      if (!starts) continue;
      if (c === 35) {
        const end = text.indexOf('\n', i);
        if (end < 0) return undefined;
        i = end;
        continue;
      }
      for (i++; i < text.length; i++) {
        const q = text.charCodeAt(i);
        if (c === 34 && q === 92) i++;
        else if (q === c) {
          if (c === 39 && text.charCodeAt(i + 1) === 39) i++;
          else break;
        }
      }
    }
  }
  return undefined;
}

/** Parse YAML text. Only syntax problems are reported here; what the data mean is checked later. */
export function parseYaml(text: string, file: string): YamlOutcome {
  const quick = readPlainYaml(text);
  if (quick) {
    let whole: ReturnType<typeof parseWhole> | undefined;
    return {
      ok: true,
      parsed: {
        text,
        data: quick.data,
        places: quick.places,
        get doc() {
          whole ??= parseWhole(text);
          return whole.doc;
        },
        get lines() {
          whole ??= parseWhole(text);
          return whole.lines;
        },
      },
    };
  }
  const { isScalar, visit } = Y();
  // Brackets nested thousands deep make the YAML reader recurse until the call stack runs out, after seconds and a
  // few hundred MB: found first, by a plain count, and said at the bracket that goes too deep.
  const deep = tooDeep(text);
  if (deep !== undefined) {
    const before = text.slice(0, deep);
    const line = before.split('\n').length;
    const column = deep - before.lastIndexOf('\n');
    return {
      ok: false,
      problems: [{ file, line, column, found: `more than ${MAX_FLOW_DEPTH} levels of [ or {`, problem: SYNTAX.RESOURCE_EXHAUSTION!.problem, fix: SYNTAX.RESOURCE_EXHAUSTION!.fix }],
    };
  }
  let doc: Document.Parsed;
  let lines: LineCounter;
  try {
    ({ doc, lines } = parseWhole(text));
  } catch (e) {
    // The parser itself gave up (for example the call stack ran out on extreme nesting).
    return {
      ok: false,
      problems: [{ file, line: 1, column: 1, problem: SYNTAX.RESOURCE_EXHAUSTION!.problem, fix: SYNTAX.RESOURCE_EXHAUSTION!.fix, found: String((e as Error)?.message ?? e) }],
    };
  }
  if (doc.errors.length > 0) {
    // After the first structural error the parser's later complaints are mostly echoes of it; duplicated keys are
    // independent, so keep those that come before the first structural error.
    const sorted = [...doc.errors].sort((a, b) => a.pos[0] - b.pos[0]);
    const problems: Problem[] = [];
    for (const err of sorted) {
      let words = SYNTAX[err.code] ?? SYNTAX_DEFAULT;
      let offset = err.pos[0];
      const reason = err.message.split('\n')[0]!.replace(/\s*at line \d+, column \d+:?$/, '').replace(/\.$/, '');
      const quote = /^Missing closing (["'])quote/.exec(reason);
      if (quote) {
        // The parser notices at the end of the text; the mistake is where the quote was opened.
        const opened = text.lastIndexOf(quote[1]!, Math.max(0, offset - 1));
        if (opened >= 0) offset = opened;
        words = {
          problem: `a ${quote[1] === '"' ? 'double' : 'single'} quote opened here is never closed`,
          fix: `Add the closing ${quote[1]} at the end of the value`,
        };
      }
      const place = placeOf(lines, offset);
      const ownWords = quote !== null || err.code === 'MULTIPLE_DOCS';
      const problem: Problem = {
        file,
        line: place.line,
        column: place.column,
        problem: ownWords ? words.problem : `${words.problem} (the YAML reader says: ${reason})`,
        fix: words.fix,
      };
      if (err.code === 'DUPLICATE_KEY') {
        const key = text.slice(err.pos[0]).split(/[:\n]/)[0]!.trim();
        if (key) problem.field = key;
        problems.push(problem);
        continue;
      }
      problems.push(problem);
      break;
    }
    return { ok: false, problems };
  }
  if (doc.contents === null || (isScalar(doc.contents) && doc.contents.value === null)) {
    return {
      ok: false,
      problems: [
        {
          file,
          line: 1,
          column: 1,
          problem: 'the claims file is empty',
          fix: 'Write at least title, organisation, sources and claims; see the example in the documentation',
        },
      ],
    };
  }
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    let firstAlias: Place = { line: 1, column: 1 };
    visit(doc, {
      Alias(_key, node) {
        if (node.range) firstAlias = placeOf(lines, node.range[0]);
        return visit.BREAK;
      },
    });
    const bomb = /excessive alias/i.test(message);
    return {
      ok: false,
      problems: [
        {
          file,
          ...firstAlias,
          problem: bomb
            ? `aliases (*name) here expand to more than ${MAX_ALIAS_COUNT} values, which a claims file never needs`
            : `an alias could not be resolved (the YAML reader says: ${message.replace(/\.$/, '')})`,
          fix: bomb
            ? 'Write the values out, or use each anchor only a few times'
            : 'Define the anchor with &name before using *name, or write the value out in full',
        },
      ],
    };
  }
  return { ok: true, parsed: { doc, lines, text, data } };
}

type Segment = string | number;

/** What a path into the data points at in the YAML: the value node and, for a mapping entry, its key node. */
export interface Located {
  value?: Place;
  key?: Place;
  /** The closest enclosing node that was found, when the path could not be followed to its end. */
  nearest: Place;
}

function nodeStart(lines: LineCounter, node: Node | null | undefined): Place | undefined {
  const range = (node as ParsedNode | null | undefined)?.range;
  return range ? placeOf(lines, range[0]) : undefined;
}

function findPair(doc: Document.Parsed, map: unknown, key: string, depth = 0): { key: Node | null; value: Node | null } | undefined {
  const { isAlias, isMap, isPair, isScalar, isSeq } = Y();
  if (!isMap(map) || depth > 20) return undefined;
  for (const pair of map.items) {
    if (!isPair(pair)) continue;
    const k = pair.key;
    const kv = isScalar(k) ? k.value : k;
    if (kv !== null && typeof kv !== 'object' && String(kv) === key) {
      return { key: k as Node | null, value: pair.value as Node | null };
    }
  }
  // Keys brought in by a merge key (<<: *defaults) live in the anchored mapping.
  for (const pair of map.items) {
    if (isPair(pair) && isScalar(pair.key) && pair.key.value === '<<') {
      const targets = isSeq(pair.value) ? pair.value.items : [pair.value];
      for (const t of targets) {
        const resolved = isAlias(t) ? t.resolve(doc) : t;
        const found = findPair(doc, resolved, key, depth + 1);
        if (found) return found;
      }
    }
  }
  return undefined;
}

/**
 * Follow a path (object keys and list indexes) through the YAML document. A path that passes through an alias stops
 * there, so the place reported is where the alias is used.
 */
export function locate(parsed: ParsedYaml, path: readonly Segment[]): Located {
  const quick = parsed.places?.get(pathKey(path));
  if (quick) return { ...quick };
  const { isAlias, isMap, isSeq } = Y();
  const { doc, lines } = parsed;
  let node: unknown = doc.contents;
  let keyNode: Node | null | undefined;
  let nearest: Place = nodeStart(lines, doc.contents) ?? { line: 1, column: 1 };
  for (let i = 0; i < path.length; i++) {
    const seg = path[i]!;
    if (isAlias(node)) {
      return { nearest: nodeStart(lines, node) ?? nearest };
    }
    if (isMap(node)) {
      const found = findPair(doc, node, String(seg));
      if (!found) return { nearest };
      keyNode = found.key;
      node = found.value;
      const here = nodeStart(lines, found.value) ?? nodeStart(lines, found.key);
      if (here) nearest = here;
    } else if (isSeq(node) && typeof seg === 'number' || (isSeq(node) && /^\d+$/.test(String(seg)))) {
      const item = (node as { items: unknown[] }).items[Number(seg)];
      if (item === undefined) return { nearest };
      keyNode = undefined;
      node = item;
      const here = nodeStart(lines, item as Node);
      if (here) nearest = here;
    } else {
      return { nearest };
    }
  }
  const located: Located = { nearest };
  const v = nodeStart(lines, node as Node | null);
  if (v) located.value = v;
  const k = nodeStart(lines, keyNode);
  if (k) located.key = k;
  return located;
}
