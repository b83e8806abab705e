/**
 * Checks the data read from a claims file against schema/claims.schema.json and turns each ajv error into a plain
 * problem: where it is (line:column), what is wrong, and how to fix it.
 */
import type { ErrorObject } from 'ajv';
import type { Problem } from '../errors.js';
import { claimsSchema, claimsValidator, type JsonSchema } from './schema.js';
import { closest } from '../suggest.js';
import { KIND_WORDS, meantExpect, meantKind } from './meant.js';
import { locate, type ParsedYaml } from './yaml.js';

type Segment = string | number;

/** An example line for each key, used in "add ..." fixes. */
const EXAMPLE: Record<string, string> = {
  title: 'title: Student voice 2026',
  organisation: "organisation: Tarnquill Students' Guild",
  sources: 'sources: followed by one entry per data file, such as "results: { file: data/summary.xlsx, shape: summary, respondents: Respondents, agree: Agreeing }"',
  claims: 'claims: followed by a list of claims, each starting with "- id: ..."',
  id: 'id: feedback-below-region',
  claim: 'claim: followed by the claim in plain words',
  kind: 'kind: compare (or kind: association)',
  file: 'file: data/summary.csv (a path relative to the claims file)',
  shape: 'shape: summary (counts per group) or shape: respondents (one row per person)',
  respondents: 'respondents: followed by the name of the column holding the number who answered',
  questions: 'questions: [Q01, Q02] listing the answer columns',
  focus: 'focus: { provider: Tarnquill College } naming the selection the claim is about',
  against: 'against: { region: Glimmerholt Vale } naming the selection it is compared with',
  expect: 'expect: lower, higher or different (compare) or positive, negative or any (association)',
  units: 'units: Department naming the column whose values are the units (or units: [Department, Institution] for each combination)',
  x: 'x: { question: Q12 } defining the first measure',
  y: 'y: { question: Q27 } defining the second measure',
  from: 'from: previous (or a value of the period column, such as 2025)',
  select: 'select: { provider: Tarnquill College } naming the selection measured',
  value: 'value: 80% (the target or benchmark, also written 0.8 or 80)',
  rows: 'rows: campus naming the column whose values are the rows of the table',
  margin: 'margin: 5 points (how close the two rates must be)',
  label: 'label: followed by the name of the control in the pack',
  column: 'column: followed by the name of a numeric column',
};

/** Keys whose values are read with their own messages by the cross-field rules (amounts written several ways). */
const READ_BY_RULES = new Set(['confidence', 'value', 'margin', 'smallest_difference', 'min_response_rate', 'worth_reporting']);

function typeWords(t: unknown): string {
  const one = (s: string): string =>
    ({
      string: 'text',
      number: 'a number',
      integer: 'a whole number',
      object: 'a mapping of keys to values',
      array: 'a list',
      boolean: 'true or false',
      null: 'empty',
    })[s] ?? s;
  return Array.isArray(t) ? t.map((x) => one(String(x))).join(' or ') : one(String(t));
}

function isPlainMapping(v: unknown): v is Record<string, unknown> {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

/** A small mapping of plain values as written in YAML's flow style ("{ col: Ratio }"), else undefined. */
function flowText(v: unknown): string | undefined {
  if (!isPlainMapping(v)) return undefined;
  const parts = Object.entries(v).map(([k, x]) => (x === null || typeof x === 'object' ? undefined : `${k}: ${String(x)}`));
  if (parts.length === 0 || parts.length > 4 || parts.some((x) => x === undefined)) return undefined;
  const text = `{ ${parts.join(', ')} }`;
  return text.length <= 80 ? text : undefined;
}

/** The numeric columns of the source of the claim at `path` (["claims", i, ...]), or none. */
function numericColumnsOf(data: unknown, path: Segment[]): string[] {
  if (!isPlainMapping(data) || path[0] !== 'claims') return [];
  const claim = (data.claims as unknown[] | undefined)?.[Number(path[1])];
  const sources = isPlainMapping(data.sources) ? data.sources : {};
  const ids = Object.keys(sources);
  const id = isPlainMapping(claim) && typeof claim.source === 'string' ? claim.source : ids.length === 1 ? ids[0] : undefined;
  const source = id !== undefined ? sources[id] : undefined;
  const numeric = isPlainMapping(source) ? source.numeric : undefined;
  return Array.isArray(numeric) ? numeric.filter((x): x is string => typeof x === 'string') : [];
}

/** The value as it is quoted in the "found" part of a message (formatProblem adds the quotes). */
function foundRaw(v: unknown): string {
  return typeof v === 'string' ? v : foundWords(v);
}

function foundWords(v: unknown): string {
  if (v === null || v === undefined) return 'nothing';
  if (Array.isArray(v)) return 'a list';
  if (typeof v === 'object') return 'a mapping';
  if (typeof v === 'boolean') return String(v);
  return JSON.stringify(v) ?? String(v);
}

/** JSON pointer (/claims/0/id) -> path segments. */
export function pointerToPath(pointer: string): Segment[] {
  if (pointer === '') return [];
  return pointer
    .slice(1)
    .split('/')
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'))
    .map((s) => (/^(0|[1-9][0-9]*)$/.test(s) ? Number(s) : s));
}

function get(data: unknown, path: readonly Segment[]): unknown {
  let v = data;
  for (const s of path) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[String(s)];
  }
  return v;
}

/** "claim "feedback-below-region"" / "source "results"" / "the claims file", for the object at `path`. */
export function describeOwner(data: unknown, path: readonly Segment[]): string {
  if (path.length >= 2 && path[0] === 'claims' && typeof path[1] === 'number') {
    const id = get(data, ['claims', path[1]!, 'id']);
    const name = typeof id === 'string' && id !== '' ? `claim "${id}"` : `claim ${path[1]! + 1}`;
    const rest = path.slice(2).map(String);
    return rest.length > 0 ? `${name}, under ${rest.join(' > ')}` : name;
  }
  if (path.length >= 2 && path[0] === 'sources') {
    const rest = path.slice(2).map(String);
    return rest.length > 0 ? `source "${path[1]}", under ${rest.join(' > ')}` : `source "${path[1]}"`;
  }
  if (path.length === 0) return 'the claims file';
  return `the claims file, under ${path.map(String).join(' > ')}`;
}

/** The keys allowed in the object at `schema`, leaving out those forbidden by a matching if/then branch. */
function allowedKeys(schema: JsonSchema, value: unknown): string[] {
  const keys = Object.keys(schema.properties ?? {});
  const forbidden = new Set<string>();
  for (const branch of schema.allOf ?? []) {
    const props = branch.if?.properties ?? {};
    const matches = Object.entries(props).every(
      ([k, s]) => typeof s === 'object' && get(value, [k]) === s.const,
    );
    if (!matches) continue;
    for (const [k, s] of Object.entries(branch.then?.properties ?? {})) if (s === false) forbidden.add(k);
  }
  return keys.filter((k) => !forbidden.has(k));
}

/** Which kind or shape allows a key that the current one forbids, e.g. units -> kind: association. */
function ownerOfKey(schema: JsonSchema, key: string): string | undefined {
  for (const branch of schema.allOf ?? []) {
    const then = branch.then?.properties ?? {};
    if (then[key] === false) continue;
    const entries = Object.entries(branch.if?.properties ?? {});
    const [name, s] = entries[0] ?? [];
    if (name && typeof s === 'object' && s.const !== undefined) {
      // The branch that does not forbid the key names the kind/shape it belongs to.
      const forbidsSomewhereElse = (schema.allOf ?? []).some((b) => b !== branch && b.then?.properties?.[key] === false);
      if (forbidsSomewhereElse) return `${name}: ${String(s.const)}`;
    }
  }
  return undefined;
}

/** Run the schema; return plain problems (unsorted). Confidence values are left to the cross-field rules. */
export function schemaProblems(parsed: ParsedYaml, file: string): Problem[] {
  const validate = claimsValidator();
  if (validate(parsed.data)) return [];
  const errors = (validate.errors ?? []) as ErrorObject[];
  const data = parsed.data;
  const problems: Problem[] = [];

  // Group-level errors (anyOf, oneOf) replace the errors of their branches; except that `against` written as a
  // mapping is a selection, whose own errors say more than "not rest and not a selection".
  const againstMapping = (e: ErrorObject): boolean => {
    const path = pointerToPath(e.instancePath);
    const v = get(data, path);
    return path[path.length - 1] === 'against' && path[0] === 'claims' && v !== null && typeof v === 'object' && !Array.isArray(v);
  };
  const dropped = errors.filter((e) => (e.keyword === 'anyOf' || e.keyword === 'const') && againstMapping(e));
  const groups = errors.filter((e) => (e.keyword === 'anyOf' || e.keyword === 'oneOf') && !dropped.includes(e));
  const isBranchError = (e: ErrorObject): boolean =>
    groups.some(
      (g) =>
        g !== e &&
        (e.instancePath === g.instancePath || e.instancePath.startsWith(g.instancePath + '/')) &&
        e.schemaPath.startsWith(g.schemaPath + '/'),
    );

  const seen = new Set<string>();
  for (const e of errors) {
    if (e.keyword === 'if' || isBranchError(e) || dropped.includes(e)) continue;
    const path = pointerToPath(e.instancePath);
    const last = path[path.length - 1];
    // Confidence and other amounts are read and range-checked with their own messages by the cross-field rules.
    if ((e.keyword === 'type' || e.keyword === 'pattern') && typeof last === 'string' && READ_BY_RULES.has(last) && (path.length === 1 || (path.length === 3 && path[0] === 'claims'))) continue;
    const p = toProblem(e, path, parsed, file, data);
    if (!p) continue;
    const key = `${p.line}:${p.column}:${p.problem}`;
    if (seen.has(key)) continue;
    seen.add(key);
    problems.push(p);
  }
  return problems;
}

function toProblem(e: ErrorObject, path: Segment[], parsed: ParsedYaml, file: string, data: unknown): Problem | undefined {
  const at = locate(parsed, path);
  const valuePlace = at.value ?? at.key ?? at.nearest;
  const parentSchema = (e.parentSchema ?? {}) as JsonSchema;
  const last = path[path.length - 1];
  // For an item of a list, the field is the list's key (agree_codes, not "0").
  const fieldSeg = typeof last === 'number' ? path[path.length - 2] : last;
  const field = fieldSeg === undefined ? undefined : String(fieldSeg);
  const value = get(data, path);
  const base = (place: { line: number; column: number }): Problem => ({ file, line: place.line, column: place.column, problem: '', fix: '' });

  // A key of a mapping that breaks the mapping's propertyNames rule (ajv reports it with the key as propertyName,
  // once as the rule's own error and once wrapped as 'propertyNames'): name the key and what keys must be.
  if (e.keyword === 'propertyNames') return undefined;
  if (e.propertyName !== undefined) {
    const p = base(locate(parsed, [...path, e.propertyName]).key ?? valuePlace);
    p.field = field;
    p.found = e.propertyName;
    p.problem = `the key "${e.propertyName}" under "${field}" is not one this mapping can hold`;
    p.fix = String(parentSchema.description ?? `See the description of "${field}" in schema/claims.schema.json`);
    return p;
  }
  switch (e.keyword) {
    case 'additionalProperties': {
      const key = String((e.params as { additionalProperty: string }).additionalProperty);
      const keyAt = locate(parsed, [...path, key]);
      const allowed = allowedKeys(parentSchema, value);
      const allKeys = Object.keys(parentSchema.properties ?? {});
      const suggestion = closest(key, allowed) ?? closest(key, allKeys);
      const p = base(keyAt.key ?? keyAt.value ?? at.nearest);
      p.field = key;
      p.problem = `"${key}" is not a key warrant knows in ${describeOwner(data, path)}`;
      p.fix =
        suggestion !== undefined
          ? `Did you mean "${suggestion}"? Rename the key to ${suggestion}`
          : `Remove it, or use one of the keys allowed here: ${allowed.join(', ')}`;
      return p;
    }
    case 'false schema': {
      // A key that exists, but not for this kind of claim or shape of source.
      const owner = path.slice(0, -1);
      const ownerValue = get(data, owner);
      const defs = claimsSchema().definitions ?? {};
      const isClaim = owner[0] === 'claims';
      const schema = (isClaim ? defs.claim : defs.source) ?? {};
      const selector = isClaim ? 'kind' : 'shape';
      const current = String(get(ownerValue, [selector]));
      const belongs = ownerOfKey(schema, String(field));
      const p = base(at.key ?? valuePlace);
      p.field = field;
      if (isClaim && (field === 'expect' || field === 'test')) {
        p.problem = `"${field}" does not apply to ${article(current)} ${current} claim, which tests no direction, in ${describeOwner(data, owner)}`;
        p.fix = `Remove ${field}`;
        return p;
      }
      if (isClaim && current === 'trend' && (field === 'focus' || field === 'against')) {
        p.problem = `"${field}" does not apply to a trend claim, which follows one selection (where) over three or more periods, in ${describeOwner(data, owner)}`;
        p.fix = 'Put the selection in where and delete focus and against; to follow two groups, write a trend claim for each; to claim that the gap between them changed between two periods, use kind: change with focus and against (expect: narrowed or widened)';
        return p;
      }
      p.problem = `"${field}" does not apply when ${selector} is ${current}${belongs ? ` (it belongs with ${belongs})` : ''}, in ${describeOwner(data, owner)}`;
      p.fix = belongs ? `Remove ${field}, or change the line to ${belongs} if that is what you meant` : `Remove ${field}`;
      return p;
    }
    case 'required': {
      const missing = String((e.params as { missingProperty: string }).missingProperty);
      const p = base(at.value ?? at.nearest);
      p.field = missing;
      p.problem = `${describeOwner(data, path)} has no "${missing}", which is required${requiredWhy(parentSchema, missing, value)}`;
      p.fix = `Add ${EXAMPLE[missing] ?? `${missing}: ...`}`;
      return p;
    }
    case 'oneOf': {
      // The only oneOf is agree / agree_percent in a summary source.
      const passing = (e.params as { passingSchemas: number[] | null }).passingSchemas;
      const p = base(at.value ?? at.nearest);
      p.field = 'agree';
      if (passing === null) {
        p.problem = `${describeOwner(data, path)} says neither which column holds the number who agreed (agree) nor the percent who agreed (agree_percent)`;
        p.fix = 'Add agree: followed by the column of counts, or agree_percent: followed by the column of percents';
      } else {
        p.problem = `${describeOwner(data, path)} gives both agree and agree_percent`;
        p.fix = 'Keep agree (exact counts) and delete agree_percent, unless the file has only percents';
      }
      return p;
    }
    case 'anyOf': {
      if (e.schemaPath.includes('/measure/')) {
        const p = base(valuePlace);
        p.field = field;
        p.found = flowText(value) ?? foundRaw(value);
        p.problem = `"${field}" in ${describeOwner(data, path.slice(0, -1))} is not a measure warrant knows`;
        const guess = typeof value === 'string' ? closest(value, ['agree', 'mean']) : undefined;
        // A numeric column named bare (x_measure: Ratio), or under another key ({ col: Ratio }, { mean: Ratio }).
        const named = typeof value === 'string' ? value : isPlainMapping(value) && Object.keys(value).length === 1 ? Object.values(value)[0] : undefined;
        const numeric = typeof named === 'string' && numericColumnsOf(data, path).includes(named) ? named : undefined;
        p.fix =
          numeric !== undefined
            ? `${numeric} is a numeric column of the source: write ${field}: { column: ${numeric} }`
            : `Write agree, mean, or { column: NAME } naming a numeric column of the source${guess !== undefined ? ` (did you mean ${guess}?)` : ''}`;
        return p;
      }
      if (path[0] === 'claims' && path.length === 3 && field === 'against') {
        const p = base(valuePlace);
        p.field = field;
        p.found = foundRaw(value);
        p.problem = `"against" in ${describeOwner(data, path.slice(0, -1))} is neither a selection nor the word rest`;
        p.fix =
          typeof value === 'string'
            ? `To compare with everyone else the claim's where selects, write against: rest (and against_label: followed by a name for the whole, such as the college); to compare with a group, write a selection such as against: { Region: ${value} }`
            : 'Write against: rest for everyone else, or a selection such as against: { Region: Glasvane Reach }';
        return p;
      }
      if (path[0] === 'claims' && (field === 'units' || field === 'rows' || field === 'columns')) {
        const p = base(valuePlace);
        p.field = field;
        p.found = foundRaw(value);
        const one = field === 'units' ? 'Department' : 'Campus';
        const two = field === 'units' ? '[Department, Institution]' : '[Campus, Mode]';
        p.problem = `"${field}" in ${describeOwner(data, path.slice(0, 2))} should name a column, or list several columns`;
        p.fix =
          field === 'columns'
            ? `Write columns: agreement, columns: answers (the answers to the question in where), a column name such as columns: Mode, or a list such as columns: [Mode, Campus]`
            : `Write ${field}: ${one} for one column, or ${field}: ${two} to use each combination of their values`;
        return p;
      }
      // Otherwise a filter value (or the list under not:).
      const p = base(valuePlace);
      p.field = field;
      p.found = foundRaw(value);
      p.problem = `the value for column "${field}" in ${describeOwner(data, path.slice(0, -1))} is not a value to match`;
      p.fix =
        value === null
          ? `Write the value after "${field}:", or a list such as [2025, 2026]`
          : 'Write text, a number, a list of them such as [2025, 2026], or { not: value }; put true/false or dates in quotes';
      return p;
    }
    case 'type': {
      const expected = (e.params as { type: string | string[] }).type;
      const p = base(valuePlace);
      if (field !== undefined) p.field = field;
      p.found = foundRaw(value);
      const what = field === undefined ? 'the claims file' : typeof last === 'number' ? `item ${last + 1} of ${field}` : `"${field}"`;
      p.problem = `${what} should be ${typeWords(expected)}`;
      if (path.length === 0) {
        p.problem = 'the claims file should be a mapping of keys (title, organisation, sources, claims)';
        p.fix = 'Start the file with lines such as "title: Student voice 2026" and "organisation: ..."';
      } else if (expected === 'string' || (Array.isArray(expected) && expected.includes('string'))) {
        p.fix = value === null ? `Write a value after "${field}:"` : 'Write it as text; put it in quotes if it looks like a number, a date or true/false';
      } else if (expected === 'array') {
        p.fix = `Write a list, e.g. ${field}: [a, b] or one "- item" per line`;
      } else if (expected === 'object' && path.length === 2 && path[0] === 'claims') {
        p.fix = 'Start each claim with "- id: ..." and put its other keys (claim, kind, ...) on the lines below, indented to line up with id';
      } else if (expected === 'object' && path.length === 2 && path[0] === 'sources') {
        p.fix = `Put the keys of source "${String(last)}" on the lines below it, indented, starting with file: and shape:`;
      } else if (expected === 'object') {
        const example = EXAMPLE[String(field)] ?? `${field}: { column: value }`;
        p.fix = value === null ? `Write the keys after "${field}:", as in ${example}, or delete the line` : `Write it as keys and values, as in ${example}`;
      } else if (expected === 'integer') {
        p.fix = 'Write a whole number without quotes, e.g. 10';
      } else {
        p.fix = `Write ${typeWords(expected)}`;
      }
      return p;
    }
    case 'enum': {
      const allowed = ((e.params as { allowedValues: unknown[] }).allowedValues ?? []).map(String);
      const p = base(valuePlace);
      p.field = field;
      p.found = foundRaw(value);
      const kind = get(data, [...path.slice(0, -1), 'kind']);
      const forKind = field === 'expect' && typeof kind === 'string' ? ` for ${article(kind)} ${kind} claim` : '';
      p.problem = `${foundWords(value)} is not an allowed value of ${field}${forKind} in ${describeOwner(data, path.slice(0, -1))}`;
      const guess = typeof value === 'string' ? closest(value, allowed) : undefined;
      p.fix = `Use one of: ${allowed.join(', ')}${guess !== undefined ? ` (did you mean ${guess}?)` : ''}`;
      // A word of the user's own for a kind or a direction: name the one meant, or say plainly what no kind can claim.
      if (field === 'kind' && path[0] === 'claims' && typeof value === 'string' && guess === undefined) {
        const meant = meantKind(value);
        const list = allowed.map((k) => `${k} (${KIND_WORDS[k] ?? k})`).join(', ');
        if (meant !== undefined && 'kind' in meant) p.fix = `Did you mean ${meant.kind} (${KIND_WORDS[meant.kind]})? Write kind: ${meant.kind}`;
        else if (meant !== undefined) {
          p.problem += `: ${meant.why}`;
          p.fix = meant.instead;
        } else p.fix = `Use one of: ${list}`;
      }
      if (field === 'expect' && path[0] === 'claims' && typeof value === 'string' && guess === undefined) {
        const meant = meantExpect(value, allowed);
        if (meant !== undefined && 'value' in meant) p.fix = `Did you mean ${meant.value}? Write expect: ${meant.value} (one of: ${allowed.join(', ')})`;
        else if (meant !== undefined) p.fix = `Use one of: ${allowed.join(', ')}; ${meant.other}`;
      }
      return p;
    }
    case 'pattern': {
      const p = base(valuePlace);
      p.field = field;
      p.found = foundRaw(value);
      if (field === 'id') {
        const slug = String(value).toLowerCase().replace(/[^a-z0-9_-]+/g, '-').replace(/^[-_]+|[-_]+$/g, '');
        p.problem = `the claim id may hold only lower-case letters, digits, - and _, and must start with a letter or digit`;
        p.fix = slug ? `Write it as ${slug}` : 'Write a short name such as feedback-below-region';
      } else {
        p.problem = `"${field}" is not written in the expected form`;
        p.fix = String(parentSchema.description ?? 'See the description of this key');
      }
      return p;
    }
    case 'minLength': {
      const p = base(valuePlace);
      p.field = field;
      p.problem = `"${field}" is empty in ${describeOwner(data, path.slice(0, -1))}`;
      p.fix = `Write a value after "${field}:"`;
      return p;
    }
    case 'minItems': {
      const p = base(valuePlace);
      p.field = field;
      p.problem = `the list "${field}" is empty in ${describeOwner(data, path.slice(0, -1))}`;
      p.fix = field === 'claims' ? 'Add at least one claim, starting with "- id: ..."' : `Put at least one item in ${field}`;
      return p;
    }
    case 'minProperties': {
      const p = base(valuePlace);
      p.field = field;
      p.problem = `"${field}" is empty in ${describeOwner(data, path.slice(0, -1))}`;
      p.fix = field === 'sources' ? `Add ${EXAMPLE.sources}` : `Add at least one column and value, e.g. ${EXAMPLE[String(field)] ?? `${field}: { column: value }`}`;
      return p;
    }
    case 'minimum': {
      const limit = (e.params as { limit: number }).limit;
      const p = base(valuePlace);
      p.field = field;
      p.found = foundRaw(value);
      p.problem = `"${field}" must be at least ${limit}`;
      p.fix = `Write a whole number of ${limit} or more, e.g. 10`;
      return p;
    }
    case 'uniqueItems': {
      const p = base(valuePlace);
      p.field = field;
      p.problem = `the list "${field}" holds the same item twice in ${describeOwner(data, path.slice(0, -1))}`;
      p.fix = 'Remove the repeated item';
      return p;
    }
    default: {
      const p = base(valuePlace);
      if (field !== undefined) p.field = field;
      p.problem = `${describeOwner(data, path)} does not fit the claims file format (${e.message ?? e.keyword})`;
      p.fix = 'Compare it with the example claims file and the descriptions in schema/claims.schema.json';
      return p;
    }
  }
}

/** ", for a compare claim" when the requirement comes from a kind/shape branch. */
function requiredWhy(schema: JsonSchema, missing: string, value: unknown): string {
  if ((schema.required ?? []).includes(missing) && schema.properties !== undefined && 'additionalProperties' in schema) {
    return '';
  }
  const kind = get(value, ['kind']);
  if (typeof kind === 'string') return ` for ${article(kind)} ${kind} claim`;
  const shape = get(value, ['shape']);
  if (typeof shape === 'string') return ` for a source of shape ${shape}`;
  return '';
}


function article(word: string): string {
  return /^[aeiou]/i.test(word) ? 'an' : 'a';
}
