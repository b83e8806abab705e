/**
 * Claims and sources that use one thing in two roles that must differ, which would build a pack from nonsense or
 * stop the statistics on degenerate input: an association of a measure with itself, a crosstab of a column against
 * itself, a selection compared with itself, a change from a period to the same period, and a summary source whose
 * respondents column is also its agreeing column (every rate 100%) or another column given two parts to play.
 * Names compare after trimming and in Unicode normalization form C, as the data readers compare them.
 */
import type { Problem } from '../errors.js';
import { nfc } from '../suggest.js';
import { describeOwner } from './validate.js';
import { locate, type ParsedYaml } from './yaml.js';

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => v !== null && typeof v === 'object' && !Array.isArray(v);

/** A value in a form where two ways of writing the same selection are equal (key order, spaces, number or text). */
function canonical(v: unknown): string {
  if (Array.isArray(v)) return `[${v.map(canonical).sort().join(',')}]`;
  if (isRec(v)) return `{${Object.keys(v).map((k) => `${JSON.stringify(nfc(k.trim()))}:${canonical(v[k])}`).sort().join(',')}}`;
  if (v === undefined || v === null) return 'null';
  return JSON.stringify(nfc(String(v).trim()));
}

const same = (a: unknown, b: unknown): boolean => canonical(a) === canonical(b);

/** The parts a column can play in a source, by key, in the order they are reported. */
const SUMMARY_ROLES = ['respondents', 'agree', 'agree_percent', 'population', 'period', 'numeric'];
const RESPONDENT_ROLES = ['question_column', 'period', 'questions'];

export function samenessProblems(parsed: ParsedYaml, file: string): Problem[] {
  const data = parsed.data;
  if (!isRec(data)) return [];
  const problems: Problem[] = [];
  const at = (path: Array<string | number>): { line: number; column: number } => {
    const l = locate(parsed, path);
    const place = l.value ?? l.key ?? l.nearest;
    return { line: place.line, column: place.column };
  };

  // Sources: one column, one part.
  const sources = isRec(data.sources) ? data.sources : {};
  for (const [id, src] of Object.entries(sources)) {
    if (!isRec(src)) continue;
    const roles = src.shape === 'respondents' ? RESPONDENT_ROLES : SUMMARY_ROLES;
    const seen = new Map<string, Array<string | number>>();
    for (const role of roles) {
      const v = src[role];
      const list: Array<[unknown, Array<string | number>]> = Array.isArray(v) ? v.map((x, k) => [x, ['sources', id, role, k]]) : [[v, ['sources', id, role]]];
      for (const [name, path] of list) {
        if (typeof name !== 'string' || name.trim() === '') continue;
        const key = nfc(name.trim());
        const first = seen.get(key);
        if (first === undefined) {
          seen.set(key, path);
          continue;
        }
        const firstRole = String(first[2]);
        const pct = (firstRole === 'respondents' && (role === 'agree' || role === 'agree_percent')) || firstRole === role;
        problems.push({
          file,
          ...at(path),
          field: role,
          found: name,
          problem:
            firstRole === role
              ? `source "${id}" lists the column "${name}" twice under ${role}`
              : `source "${id}" uses the column "${name}" both as ${firstRole} (line ${at(first).line}) and as ${role}${pct ? ', so every rate would be 100%' : ''}; each column can play one part only`,
          fix: firstRole === role ? 'List each column once' : `Name the column that holds the ${ROLE_WORDS[role] ?? role} under ${role}`,
        });
      }
    }
  }

  // Claims: two roles that must name different things.
  const claims = Array.isArray(data.claims) ? data.claims : [];
  claims.forEach((c, i) => {
    if (!isRec(c)) return;
    const owner = describeOwner(data, ['claims', i]);
    const push = (key: string, problem: string, fix: string): void => {
      problems.push({ file, ...at(['claims', i, key]), field: key, found: canonicalShown(c[key]), problem: `${owner} ${problem}`, fix });
    };
    if (c.kind === 'association' && 'x' in c && 'y' in c && same(c.x, c.y) && same(c.x_measure ?? 'agree', c.y_measure ?? 'agree')) {
      push('y', 'measures the same thing on both axes (x and y select the same answers with the same measure), so it could only find a perfect association', 'Select a different question or measure for y than for x');
    }
    if (c.kind === 'crosstab' && typeof c.rows === 'string' && typeof c.columns === 'string' && same(c.rows, c.columns)) {
      push('columns', `crosses the column "${c.rows}" with itself, so every answer would fall on the table's diagonal`, 'Name two different columns under rows and columns');
    }
    if ((c.kind === 'compare' || c.kind === 'means' || c.kind === 'equivalence' || c.kind === 'change') && 'focus' in c && 'against' in c && same(c.focus, c.against)) {
      push('against', 'compares a selection with itself (focus and against are the same), so the difference is zero by construction', 'Make against the selection the focus is compared with, e.g. another department or the rest of the region');
    }
    if (c.kind === 'change' && 'from' in c && 'to' in c && same(c.from, c.to)) {
      push('to', 'asks for a change from a period to the same period', 'Make from the earlier period and to the later one, e.g. from: 2025 and to: 2026');
    }
  });
  return problems;
}

const ROLE_WORDS: Record<string, string> = {
  respondents: 'number who answered',
  agree: 'number who agreed',
  agree_percent: 'percent who agreed',
  population: 'number invited (eligible)',
  period: 'survey period (such as the year)',
  numeric: 'numbers to average',
  question_column: 'question names',
  questions: 'answers to a question',
};

/** A value as it might be written in the claims file: text as it is, a filter as { column: value }. */
function canonicalShown(v: unknown): string {
  if (isRec(v)) return `{ ${Object.entries(v).map(([k, x]) => `${k}: ${canonicalShown(x)}`).join(', ')} }`;
  if (Array.isArray(v)) return `[${v.map(canonicalShown).join(', ')}]`;
  return String(v);
}
