/**
 * A quick reader for the plain YAML that claims files are written in: block mappings and lists, one-line flow
 * mappings and lists ({ year: latest, unit: "A" }, [4, 5]), plain, single- and double-quoted one-line scalars and
 * comments. It gives the same data as the `yaml` package (YAML 1.2 core schema, as src/claims/yaml.ts parses) and the
 * line and column of every value, and returns undefined for anything else: anchors, aliases, tags, merge keys, block
 * scalars, values over several lines, escapes, tabs, several documents, duplicate keys, a file that is not a
 * mapping, and every mistake. Those files go to the `yaml` package, whose messages name the problem.
 *
 * Parsing a 200-claim file with the `yaml` package took about 0.2 s (most of it its first-run compilation), and
 * loading it 0.04 s more; this reader takes a few milliseconds. tests/claims/yaml-plain.test.ts checks it against the
 * `yaml` package (data and places) on every claims file in the repository and on generated files.
 */
import type { Place } from './types.js';

/** Where a value is: its own place, its key's place for a mapping entry, and the nearest place (the value's). */
export interface QuickPlace {
  value: Place;
  key?: Place;
  nearest: Place;
}

export interface PlainYaml {
  data: Record<string, unknown>;
  /** Every value's place, by pathKey of its path from the top. */
  places: Map<string, QuickPlace>;
}

/** The key of a path (object keys and list indexes) in PlainYaml.places. */
export function pathKey(path: ReadonlyArray<string | number>): string {
  let key = '';
  for (const seg of path) key += `\u0001${String(seg)}`;
  return key;
}

/** Thrown inside the reader when the text leaves the plain subset; caught by readPlainYaml. */
class NotPlain extends Error {}

const notPlain = (): never => {
  throw new NotPlain();
};

/** YAML 1.2 core schema resolution of a plain scalar (the tests and functions of yaml 2's core schema tags). */
function resolvePlain(s: string): unknown {
  // Only these first characters can start a null, a boolean or a number; anything else is text.
  if (s !== '' && !/^[-+.0-9~nNtTfF]/.test(s)) return s;
  if (/^(?:~|[Nn]ull|NULL)?$/.test(s)) return null;
  if (/^(?:[Tt]rue|TRUE|[Ff]alse|FALSE)$/.test(s)) return s[0] === 't' || s[0] === 'T';
  if (/^0o[0-7]+$/.test(s)) return parseInt(s.substring(2), 8);
  if (/^[-+]?[0-9]+$/.test(s)) return parseInt(s, 10);
  if (/^0x[0-9a-fA-F]+$/.test(s)) return parseInt(s.substring(2), 16);
  // .inf and .nan are left to the yaml package.
  if (/^(?:[-+]?\.(?:inf|Inf|INF)|\.nan|\.NaN|\.NAN)$/.test(s)) notPlain();
  if (/^[-+]?(?:\.[0-9]+|[0-9]+(?:\.[0-9]*)?)[eE][-+]?[0-9]+$/.test(s)) return parseFloat(s);
  if (/^[-+]?(?:\.[0-9]+|[0-9]+\.[0-9]*)$/.test(s)) return parseFloat(s);
  return s;
}

/** Characters a plain scalar may not start with (YAML 1.2.2 §7.3.3: c-indicator), - ? : only before a space. */
const INDICATOR = /^(?:[,[\]{}#&*!|>'"%@`]|[-?:](?: |$))/;

interface Line {
  /** Offset of the line's first character in the text. */
  start: number;
  /** Index of the line (0-based). */
  number: number;
  /** Spaces before the content. */
  indent: number;
  /** The line without its indent. */
  content: string;
}

class Reader {
  private readonly lines: Line[] = [];
  private readonly raw: string[];
  private at = 0;
  readonly places = new Map<string, QuickPlace>();

  constructor(text: string) {
    let start = 0;
    const raw = (this.raw = text.split('\n'));
    raw.forEach((line, number) => {
      const indent = line.length - trimStart(line).length;
      const content = line.slice(indent);
      // Blank lines and whole-line comments carry nothing.
      if (content !== '' && !content.startsWith('#')) {
        // Document markers and directives are left to the yaml package.
        if (indent === 0 && (/^(?:---|\.\.\.)(?: |$)/.test(content) || content.startsWith('%'))) notPlain();
        this.lines.push({ start, number, indent, content });
      }
      start += line.length + 1;
    });
  }

  private place(line: Line, column: number): Place {
    return { line: line.number + 1, column: column + 1 };
  }

  private record(path: Array<string | number>, value: Place, key?: Place): void {
    this.places.set(pathKey(path), key ? { value, key, nearest: value } : { value, nearest: value });
  }

  top(): Record<string, unknown> {
    const first = this.lines[0] ?? notPlain();
    if (first.indent !== 0 || isItem(first.content)) notPlain();
    const data = this.mapping(0, [], 0);
    if (this.at < this.lines.length) notPlain();
    this.record([], this.place(first, 0));
    return data;
  }

  /**
   * A block mapping whose keys stand at column `indent`. `firstContent` is the text of its first line from the key on,
   * for a mapping that starts after "- " on a list item's line.
   */
  private mapping(indent: number, path: Array<string | number>, depth: number, firstContent?: string): Record<string, unknown> {
    if (depth > 40) notPlain();
    const out: Record<string, unknown> = {};
    const seen = new Set<string>();
    let first = true;
    while (this.at < this.lines.length) {
      const line = this.lines[this.at]!;
      let content: string;
      if (first && firstContent !== undefined) {
        content = firstContent;
      } else {
        if (line.indent < indent) break;
        if (line.indent > indent) notPlain();
        if (isItem(line.content)) break;
        content = line.content;
      }
      first = false;
      this.at++;
      // The key: quoted, or plain up to a colon followed by a space or the end of the line.
      let key: string;
      let rest: string;
      if (content[0] === '"' || content[0] === "'") {
        const q = quoted(content, 0);
        key = q.value;
        if (content[q.end] !== ':') notPlain();
        rest = content.slice(q.end + 1);
      } else {
        const m = /^([^ :#][^:#]*):(?: |$)/.exec(content) ?? notPlain();
        const written = m[1]!;
        if (INDICATOR.test(written) || written.endsWith(' ') || written.length > 1024) notPlain();
        key = keyString(resolvePlain(written));
        rest = content.slice(written.length + 1);
      }
      if (rest !== '' && rest[0] !== ' ') notPlain();
      if (seen.has(key) || key === '__proto__' || key === '<<') notPlain();
      seen.add(key);
      const keyPlace = this.place(line, indent);
      const valuePath = [...path, key];
      const trimmed = trimStart(rest);
      let value: unknown;
      if (trimmed === '' || trimmed.startsWith('#')) {
        // The value is the block below, or nothing.
        const next = this.lines[this.at];
        if (next && (next.indent > indent || (next.indent === indent && isItem(next.content)))) {
          value = isItem(next.content) ? this.sequence(next.indent, valuePath, depth + 1) : this.mapping(next.indent, valuePath, depth + 1);
          this.record(valuePath, this.place(next, next.indent), keyPlace);
        } else {
          // An empty value: yaml gives null; its place is left to the yaml package.
          value = null;
        }
      } else if (/^[>|]-?(?: +#.*| *)$/.test(trimmed)) {
        const valueColumn = indent + content.length - trimmed.length;
        value = this.blockScalar(line, indent, trimmed);
        this.record(valuePath, this.place(line, valueColumn), keyPlace);
      } else {
        const valueColumn = indent + content.length - trimmed.length;
        value = this.inline(trimmed, line, valueColumn, valuePath, depth);
        this.record(valuePath, this.place(line, valueColumn), keyPlace);
        // A value continued on the lines below is left to the yaml package.
        const next = this.lines[this.at];
        if (next && next.indent > indent) notPlain();
      }
      if (key in out) Object.defineProperty(out, key, { value, writable: true, enumerable: true, configurable: true });
      else out[key] = value;
    }
    return out;
  }

  /**
   * A block scalar (| literal or > folded, clipped or stripped with -) under a key at column `parent`, on the lines
   * after `line`. Taken only when every line of it is indented alike: more-indented lines, blank lines before the
   * text or holding spaces, and lines ending in spaces are left to the yaml package (YAML 1.2.2 §8.1).
   */
  private blockScalar(line: Line, parent: number, header: string): string {
    const literal = header[0] === '|';
    const strip = header[1] === '-';
    const texts: Array<string | null> = [];
    let indent = -1;
    let last = line.number;
    for (let r = line.number + 1; r < this.raw.length; r++) {
      const text = this.raw[r]!;
      const spaces = text.length - trimStart(text).length;
      if (spaces === text.length) {
        if (indent < 0 || spaces > indent) notPlain();
        texts.push(null);
        continue;
      }
      if (spaces <= parent) break;
      if (indent < 0) indent = spaces;
      if (spaces !== indent || text.endsWith(' ')) notPlain();
      texts.push(text.slice(indent));
      last = r;
    }
    while (texts.length > 0 && texts[texts.length - 1] === null) texts.pop();
    if (texts.length === 0) notPlain();
    let value = '';
    let blanks = 0;
    texts.forEach((t, i) => {
      if (t === null) {
        blanks++;
        return;
      }
      if (i > 0) value += literal ? '\n'.repeat(blanks + 1) : blanks > 0 ? '\n'.repeat(blanks) : ' ';
      value += t;
      blanks = 0;
    });
    // Step past the scalar's lines (some of which may have looked like comments).
    while (this.at < this.lines.length && this.lines[this.at]!.number <= last) this.at++;
    return strip ? value : `${value}\n`;
  }

  /** A block list whose dashes stand at column `indent`. */
  private sequence(indent: number, path: Array<string | number>, depth: number): unknown[] {
    if (depth > 40) notPlain();
    const out: unknown[] = [];
    while (this.at < this.lines.length) {
      const line = this.lines[this.at]!;
      if (line.indent < indent) break;
      if (line.indent > indent) notPlain();
      if (!isItem(line.content)) break;
      const after = line.content.slice(1);
      const trimmed = trimStart(after);
      if (trimmed === '' || trimmed.startsWith('#') || trimmed.startsWith('- ') || trimmed === '-') notPlain();
      const col = indent + 1 + (after.length - trimmed.length);
      const itemPath = [...path, out.length];
      if (/^[^ #:"'[{][^:#]*:(?: |$)/.test(trimmed)) {
        // "- key: value": a mapping whose keys stand where its first key does.
        out.push(this.mapping(col, itemPath, depth + 1, trimmed));
        this.record(itemPath, this.place(line, col));
      } else {
        this.at++;
        out.push(this.inline(trimmed, line, col, itemPath, depth));
        this.record(itemPath, this.place(line, col));
        const next = this.lines[this.at];
        if (next && next.indent > indent) notPlain();
      }
    }
    return out;
  }

  /** A value written on its line: a flow collection, a quoted scalar or a plain scalar, then at most a comment. */
  private inline(text: string, line: Line, col: number, path: Array<string | number>, depth: number): unknown {
    if (text[0] === '{' || text[0] === '[') {
      const f = new Flow(text, line, col, this, depth);
      const value = f.value(path);
      f.end();
      return value;
    }
    if (text[0] === '"' || text[0] === "'") {
      const q = quoted(text, 0);
      const rest = text.slice(q.end);
      if (rest !== '' && !/^ +(?:#.*)?$/.test(rest)) notPlain();
      return q.value;
    }
    if (INDICATOR.test(text)) notPlain();
    const hash = text.search(/ #/);
    const plain = trimEnd(hash >= 0 ? text.slice(0, hash) : text);
    if (/:(?: |$)/.test(plain) || plain === '') notPlain();
    return resolvePlain(plain);
  }

  /** Record a value's place from inside a flow collection. */
  flowPlace(path: Array<string | number>, line: Line, col: number, keyCol?: number): void {
    this.record(path, this.place(line, col), keyCol !== undefined ? this.place(line, keyCol) : undefined);
  }
}

/** A one-line flow collection ({ a: 1, b: "x" } or [1, 2]), possibly nested. */
class Flow {
  private i = 0;

  constructor(
    private readonly text: string,
    private readonly line: Line,
    private readonly col: number,
    private readonly reader: Reader,
    private readonly depth: number,
  ) {}

  private spaces(): void {
    while (this.text[this.i] === ' ') this.i++;
  }

  value(path: Array<string | number>, nesting = 0): unknown {
    if (nesting + this.depth > 40) notPlain();
    this.spaces();
    const c = this.text[this.i];
    let value: unknown;
    if (c === '{') value = this.map(path, nesting);
    else if (c === '[') value = this.seq(path, nesting);
    else if (c === '"' || c === "'") {
      const q = quoted(this.text, this.i);
      this.i = q.end;
      value = q.value;
    } else {
      const m = /^[^,[\]{}#: '"&*!|>%@`](?:[^,[\]{}:#]*[^,[\]{}:# ])?/.exec(this.text.slice(this.i)) ?? notPlain();
      if (/^[-?](?: |$)/.test(m[0])) notPlain();
      this.i += m[0].length;
      value = resolvePlain(m[0]);
    }
    return value;
  }

  private map(path: Array<string | number>, nesting: number): Record<string, unknown> {
    this.i++; // {
    const out: Record<string, unknown> = {};
    const seen = new Set<string>();
    this.spaces();
    if (this.text[this.i] === '}') {
      this.i++;
      return out;
    }
    for (;;) {
      this.spaces();
      const keyStart = this.i;
      let key: string;
      const c = this.text[this.i];
      if (c === '"' || c === "'") {
        const q = quoted(this.text, this.i);
        this.i = q.end;
        key = q.value;
      } else {
        const m = /^[^,[\]{}#: '"&*!|>%@`?-](?:[^,[\]{}:#]*[^,[\]{}:# ])?/.exec(this.text.slice(this.i)) ?? notPlain();
        this.i += m[0].length;
        key = keyString(resolvePlain(m[0]));
        if (key === '<<') notPlain();
      }
      if (this.text[this.i] !== ':' || this.text[this.i + 1] !== ' ') notPlain();
      this.i += 1;
      this.spaces();
      if (seen.has(key) || key === '__proto__') notPlain();
      seen.add(key);
      const valueStart = this.i;
      const c2 = this.text[this.i];
      if (c2 === ',' || c2 === '}' || c2 === undefined) notPlain();
      const value = this.value([...path, key], nesting + 1);
      this.reader.flowPlace([...path, key], this.line, this.col + valueStart, this.col + keyStart);
      if (key in out) Object.defineProperty(out, key, { value, writable: true, enumerable: true, configurable: true });
      else out[key] = value;
      this.spaces();
      if (this.text[this.i] === ',') {
        this.i++;
        this.spaces();
        if (this.text[this.i] === '}') notPlain();
        continue;
      }
      if (this.text[this.i] === '}') {
        this.i++;
        return out;
      }
      notPlain();
    }
  }

  private seq(path: Array<string | number>, nesting: number): unknown[] {
    this.i++; // [
    const out: unknown[] = [];
    this.spaces();
    if (this.text[this.i] === ']') {
      this.i++;
      return out;
    }
    for (;;) {
      this.spaces();
      const start = this.i;
      const c = this.text[this.i];
      if (c === ',' || c === ']' || c === undefined) notPlain();
      const itemPath = [...path, out.length];
      out.push(this.value(itemPath, nesting + 1));
      this.reader.flowPlace(itemPath, this.line, this.col + start);
      this.spaces();
      // A key inside a list makes a one-pair mapping: left to the yaml package.
      if (this.text[this.i] === ':') notPlain();
      if (this.text[this.i] === ',') {
        this.i++;
        this.spaces();
        if (this.text[this.i] === ']') notPlain();
        continue;
      }
      if (this.text[this.i] === ']') {
        this.i++;
        return out;
      }
      notPlain();
    }
  }

  /** After the collection: nothing, or spaces and a comment. */
  end(): void {
    const rest = this.text.slice(this.i);
    if (rest !== '' && !/^ +(?:#.*)?$/.test(rest)) notPlain();
  }
}

/** Text without the spaces (only spaces: YAML's white space, tabs being refused) at its start or end. */
function trimStart(s: string): string {
  let i = 0;
  while (s.charCodeAt(i) === 32) i++;
  return s.slice(i);
}

function trimEnd(s: string): string {
  let i = s.length;
  while (i > 0 && s.charCodeAt(i - 1) === 32) i--;
  return s.slice(0, i);
}

/** Is this line's content a list item ("- ..." or a lone "-")? */
function isItem(content: string): boolean {
  return content === '-' || content.startsWith('- ');
}

/**
 * How yaml turns a key's value into an object key (addPairToJSMap's stringifyKey for scalars). An empty key (null,
 * ~) is left to the yaml package, whose places are not found for it.
 */
function keyString(v: unknown): string {
  return v === null ? notPlain() : String(v);
}

/** A quoted scalar starting at `from` on one line: '' doubles a single quote; a backslash is left to yaml. */
function quoted(text: string, from: number): { value: string; end: number } {
  const q = text[from]!;
  if (q === '"') {
    const close = text.indexOf('"', from + 1);
    if (close < 0) return notPlain();
    const value = text.slice(from + 1, close);
    if (value.includes('\\')) return notPlain();
    return { value, end: close + 1 };
  }
  let value = '';
  let i = from + 1;
  for (;;) {
    const close = text.indexOf("'", i);
    if (close < 0) return notPlain();
    value += text.slice(i, close);
    if (text[close + 1] === "'") {
      value += "'";
      i = close + 2;
      continue;
    }
    return { value, end: close + 1 };
  }
}

/** Read `text` if it is plain YAML (see above); undefined otherwise. */
export function readPlainYaml(text: string): PlainYaml | undefined {
  // Tabs, carriage returns, byte-order marks and the characters other YAML versions take for line breaks are left to
  // the yaml package.
  if (/[\t\r\uFEFF\u0085\u2028\u2029]/.test(text)) return undefined;
  try {
    const reader = new Reader(text);
    const data = reader.top();
    return { data, places: reader.places };
  } catch (e) {
    if (e instanceof NotPlain) return undefined;
    throw e;
  }
}
