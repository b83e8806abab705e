/**
 * `warrant check claims.yaml [--json]`: check a claims file against the schema and against its data, and report
 * every problem at once with file:line:column. Exit code 0 when clean, 2 when not.
 *
 * After the claims file itself passes (schema and cross-field rules, src/claims/read.ts), each source's header is
 * read to check the columns the claims name, then the source is read into a cube (src/data/cube.ts) to check every
 * value a filter names (relative periods resolved against the period column), that every selection matches some
 * rows, and that a claim's two selections are either separate or one inside the other.
 */
import { statSync } from 'node:fs';
import { resolve } from 'node:path';
import { columnsUsed } from '../analyse/index.js';
import { displayPathFor, inFileOrder, readClaimsLeniently } from '../claims/read.js';
import { orderIsInTime, orderPeriods, periodsBack, resolvePeriod } from '../claims/periods.js';
import { scanTable } from '../claims/scan.js';
import type { Claim, Filter, FilterScalar, FilterValue, SourceSpec } from '../claims/types.js';
import { locate, type ParsedYaml } from '../claims/yaml.js';
import { claimsSpellings, readCube } from '../data/cube.js';
import type { Cell, Cube } from '../data/types.js';
import { formatProblem, formatProblems, InputError, type Problem } from '../errors.js';
import { findName, fixFor, nfc } from '../suggest.js';
import { readingNotes } from '../data/reading-notes.js';
import { Templates } from '../verdicts/templates.js';
import { wordsProblems } from '../claims/wording.js';

export interface CheckOptions {
  /** The claims file. */
  claims: string;
  /** Print a JSON report instead of text. */
  json?: boolean;
  /** Where output goes (default: process.stdout). */
  write?: (text: string) => void;
}

export interface CheckReport {
  /** The claims file as shown in messages. */
  file: string;
  /** Claims and sources read (undefined when the claims file itself could not be read). */
  claims?: number;
  sources?: number;
  /** Every problem found, claims-file problems first in file order, then data problems. */
  problems: Problem[];
  /** Claims whose own words and fields say different things (src/claims/wording.ts): warnings, not problems. */
  warnings?: Problem[];
  /** How each source's table was read (rows taken as notes, suppressed rows, footnote markers), when there is anything to say. */
  reading?: Array<{ source: string; file: string; notes: string[] }>;
}

type Path = Array<string | number>;

/** One filter with where it is written: the path of the mapping in the claims file. */
interface PlacedFilter {
  path: Path;
  filter: Filter;
}

/** A filter with relative periods resolved and lists expanded: column -> accepted (or refused) texts. */
type Resolved = Record<string, { values: Set<string>; negate: boolean }>;

function textsOf(v: FilterScalar | FilterScalar[]): FilterScalar[] {
  return Array.isArray(v) ? v : [v];
}

function matchesResolved(cell: Cell, filter: Resolved): boolean {
  for (const [col, want] of Object.entries(filter)) {
    const have = cell.dims[col];
    if (have === undefined) return false;
    if (want.values.has(have) === want.negate) return false;
  }
  return true;
}

/** The filters of a normalized claim with their paths in the claims file (index i of claims). */
function filtersOf(claim: Claim, i: number): Record<string, PlacedFilter> {
  const at = (key: string): Path => ['claims', i, key];
  const out: Record<string, PlacedFilter> = { where: { path: at('where'), filter: claim.where } };
  if ('focus' in claim) {
    out.focus = { path: at('focus'), filter: claim.focus };
  }
  if ('against' in claim) out.against = { path: at('against'), filter: claim.against };
  if ('select' in claim) out.select = { path: at('select'), filter: claim.select };
  if (claim.kind === 'association') {
    out.x = { path: at('x'), filter: claim.x };
    out.y = { path: at('y'), filter: claim.y };
    claim.controls.forEach((c, j) => {
      if (Object.keys(c.filter).length > 0) out[`control ${j + 1}`] = { path: ['claims', i, 'controls', j, 'where'], filter: c.filter };
    });
  }
  return out;
}

/** Check a claims file and its data; never throws for problems in the user's files (they are returned). */
export async function checkClaimsFile(path: string, displayPath?: string): Promise<CheckReport> {
  const absPath = resolve(path);
  const read = await readClaimsLeniently(absPath, displayPath ?? displayPathFor(absPath));
  const file = read.file;
  const claims = read.claims;
  const parsed = read.parsed;
  if (claims === undefined || parsed === undefined) return { file, problems: read.problems };
  const claimProblems: Problem[] = [...read.problems];
  const dataProblems: Problem[] = [];
  const place = (p: Path, prefer: 'key' | 'value'): { line: number; column: number } => {
    const l = locate(parsed, p);
    const at = prefer === 'key' ? (l.key ?? l.value ?? l.nearest) : (l.value ?? l.key ?? l.nearest);
    return { line: at.line, column: at.column };
  };

  const templates = new Templates();
  const reading: NonNullable<CheckReport['reading']> = [];
  // Each source's values, so that a claim's words can be read against what its selections pick (src/claims/wording.ts).
  const valuesOf = new Map<string, { values: Cube['values']; period?: string }>();
  for (const source of claims.sources) {
    const users = claims.claims.map((c, i) => ({ claim: c, i })).filter((u) => u.claim.source === source.id);
    // A data file that is missing or of the wrong type was reported with the claims file's own problems.
    if (users.length === 0 || source.format === undefined || !isFile(source.path)) continue;
    const skip = new Set<Claim>();
    const cube = await sourceCube(source, users, file, place, claimProblems, dataProblems, skip, parsed.data);
    if (cube === undefined) continue;
    valuesOf.set(source.id, { values: cube.values, ...(source.period !== undefined ? { period: source.period } : {}) });
    const notes = readingNotes(cube, templates);
    if (notes.length > 0) reading.push({ source: source.id, file: cube.file, notes });
    for (const { claim, i } of users) if (!skip.has(claim)) claimProblems.push(...claimDataProblems(claim, i, source, cube, file, place, parsed));
  }
  const warnings = wordsProblems(claims, file, (c) => valuesOf.get(c.source));
  return {
    file,
    claims: claims.claims.length,
    sources: claims.sources.length,
    problems: [...inFileOrder(claimProblems), ...dataProblems],
    ...(warnings.length > 0 ? { warnings } : {}),
    ...(reading.length > 0 ? { reading } : {}),
  };
}

function isFile(path: string): boolean {
  try {
    return statSync(path).isFile();
  } catch {
    return false;
  }
}

type PlaceOf = (p: Path, prefer: 'key' | 'value') => { line: number; column: number };

/** Check the columns a source's claims name against its header, then read it into a cube (undefined on problems). */
async function sourceCube(
  source: SourceSpec,
  users: Array<{ claim: Claim; i: number }>,
  file: string,
  place: PlaceOf,
  claimProblems: Problem[],
  dataProblems: Problem[],
  skip: Set<Claim>,
  written: unknown,
): Promise<Cube | undefined> {
  const display = displayPathFor(source.path);
  let header: string[];
  let aliases: string[] = [];
  try {
    const scan = await scanTable(source.path, source.format, {
      displayPath: display,
      headerOnly: true,
      ...(source.sheet !== undefined ? { sheet: source.sheet } : {}),
      ...(source.headerRow !== undefined ? { headerRow: source.headerRow } : {}),
      ...(source.headerRows !== undefined ? { headerRows: source.headerRows } : {}),
      ...(source.suppressed !== undefined ? { suppressed: source.suppressed } : {}),
    });
    // Names match under Unicode normalization form C, as the data readers match them (src/data/cube.ts).
    const spelled = claimsSpellings(source, users.flatMap((u) => columnsUsed(u.claim)));
    header = scan.columns.map((c) => spelled.get(nfc(c.name)) ?? c.name);
    // A count or answer column of a two-row header answers to either row's text (groups go by the name only).
    aliases = scan.columns.flatMap((c) => (c.alias !== undefined ? [c.alias] : []));
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    dataProblems.push(...e.problems);
    return undefined;
  }
  const sourceBefore = claimProblems.length;
  // Columns named by the source itself.
  const sourceColumns: Array<[Path, string]> = [];
  const sp = (key: string, k?: number): Path => (k === undefined ? ['sources', source.id, key] : ['sources', source.id, key, k]);
  if (source.respondents !== undefined) sourceColumns.push([sp('respondents'), source.respondents]);
  if (source.agree !== undefined) sourceColumns.push([sp('agree'), source.agree]);
  if (source.agreePercent !== undefined) sourceColumns.push([sp('agree_percent'), source.agreePercent]);
  if (source.population !== undefined) sourceColumns.push([sp('population'), source.population]);
  if (source.period !== undefined) sourceColumns.push([sp('period'), source.period]);
  (source.questions ?? []).forEach((q, k) => sourceColumns.push([sp('questions', k), q]));
  (source.numeric ?? []).forEach((q, k) => sourceColumns.push([sp('numeric', k), q]));
  for (const [p, name] of sourceColumns) {
    if (header.includes(name) || (aliases.includes(name) && p[2] !== 'period')) continue;
    claimProblems.push({
      file,
      ...place(p, 'value'),
      field: String(typeof p[p.length - 1] === 'number' ? p[p.length - 2] : p[p.length - 1]),
      found: name,
      problem: `the data file of source "${source.id}" (${display}) has no column with this name`,
      fix: fixFor(name, header, 'columns'),
    });
  }
  // Columns the claims select on.
  const measures = new Set([source.respondents, source.agree, source.agreePercent, source.population, ...(source.numeric ?? [])].filter((c): c is string => c !== undefined));
  const selectable = source.shape === 'respondents' ? [...header.filter((h) => !(source.questions ?? []).includes(h)), source.questionColumn] : header.filter((h) => !measures.has(h));
  if (claimProblems.length > sourceBefore) return undefined;
  for (const { claim, i } of users) {
    const before = claimProblems.length;
    const named: Array<[Path, string, 'key' | 'value']> = [];
    const filters = Object.values(filtersOf(claim, i));
    for (const f of filters) for (const col of Object.keys(f.filter)) named.push([[...f.path, col], col, 'key']);
    // units, rows and columns name one column or a list; the path of a listed one ends in its index.
    const grouping = (key: string, cols: readonly string[]): void => {
      const raw = (written as { claims?: Array<Record<string, unknown>> }).claims?.[i]?.[key];
      cols.forEach((c, k) => named.push([Array.isArray(raw) ? ['claims', i, key, k] : ['claims', i, key], c, 'value']));
    };
    if (claim.kind === 'association') grouping('units', claim.units);
    if (claim.kind === 'rank' || claim.kind === 'every') grouping('units', [claim.units]);
    if (claim.kind === 'crosstab') {
      grouping('rows', claim.rows);
      if (Array.isArray(claim.columns)) grouping('columns', claim.columns);
    }
    for (const [p, col, prefer] of named) {
      if (selectable.includes(col)) continue;
      const key = String(p[2] ?? '');
      // { column: Ratio } is the form of a measure (x_measure, y_measure, measure), written where rows are selected.
      const written = prefer === 'key' && /^(column|measure)$/i.test(col) ? filters.find((f) => f.path.length === p.length - 1 && f.path.every((x, k) => x === p[k]))?.filter[col] : undefined;
      if (written !== undefined && (typeof written === 'string' || typeof written === 'number')) {
        const selection = p.slice(2, -1).join(' ');
        const value = String(written);
        const measureKey = claim.kind === 'association' && (key === 'x' || key === 'y') ? `${key}_measure` : claim.kind === 'means' ? 'measure' : undefined;
        const rowsKey = key === 'x' || key === 'y' ? key : 'where';
        const units: readonly string[] = claim.kind === 'association' ? claim.units : [];
        const example = selectable.find((c) => !units.includes(c) && c !== source.period) ?? selectable[0] ?? 'Question';
        claimProblems.push({
          file,
          ...place(p, prefer),
          field: selection,
          found: `{ ${col}: ${value} }`,
          problem: `${selection} in claim "${claim.id}" selects rows by the values of their columns, and the data of source "${source.id}" have no column "${col}"; { ${col}: ${value} } is how a measure is written`,
          fix:
            measureKey !== undefined
              ? `To measure the numeric column ${value}, write ${measureKey}: { column: ${value} }${measureKey === 'measure' ? '' : ` beside ${key}`}, and let ${rowsKey} select the rows it is measured on, e.g. ${rowsKey}: { ${example}: ... }`
              : `A ${claim.kind} claim measures agreement; a numeric column such as ${value} can be measured by an association claim (x_measure: { column: ${value} }) or a means claim (measure: { column: ${value} }). Here, select rows by a column of the data (${lowerFirst(fixFor(col, selectable, 'columns'))})`,
        });
        continue;
      }
      const isQuestion = (source.questions ?? []).includes(col);
      const isMeasure = measures.has(col) || isQuestion;
      // "units: Department, Institution" is one name with a comma: the columns were meant as a list.
      const parts = col.split(',').map((x) => x.trim());
      const listMeant = (key === 'units' || key === 'rows' || key === 'columns') && parts.length > 1 && parts.every((x) => selectable.includes(x));
      let fix: string;
      if (listMeant) fix = `To make the ${key === 'units' ? 'units' : `table's ${key}`} the combinations of several columns, write them as a list: ${key}: [${parts.join(', ')}]`;
      else if (isQuestion && key === 'columns') fix = `To spread the answers to ${col} across the table's columns, write columns: answers and select the question in where, e.g. where: { ${source.questionColumn}: ${col} }`;
      else if (isQuestion && key === 'rows') fix = `A question's answers can be the table's columns, not its rows: write columns: answers with ${source.questionColumn}: ${col} in where, and rows: the column that splits the respondents (such as a campus or the period)`;
      else if (isQuestion && key === 'units') fix = `Units are groups of respondents (such as departments); measure ${col} on each unit with x: { ${source.questionColumn}: ${col} } or y: { ${source.questionColumn}: ${col} }`;
      else if (isMeasure && source.shape === 'respondents') fix = `Select a question with { ${source.questionColumn}: ${col} } instead`;
      else if (isMeasure) fix = 'Select rows by the columns that describe them, such as a provider or a question';
      else fix = fixFor(col, selectable, 'columns');
      claimProblems.push({
        file,
        ...place(p, prefer),
        field: col,
        found: col,
        problem: listMeant
          ? `the data of source "${source.id}" have no column "${col}", but each of ${parts.map((x) => `"${x}"`).join(' and ')} is a column`
          : isMeasure
            ? `"${col}" is a measure column of source "${source.id}", not a column to select on`
            : `the data of source "${source.id}" have no column "${col}" to select on`,
        fix,
      });
    }
    if (claimProblems.length > before) skip.add(claim);
  }
  const needed = [...new Set([...users.flatMap((u) => columnsUsed(u.claim)), ...(source.period !== undefined ? [source.period] : [])])].filter((c) =>
    selectable.includes(c),
  );
  try {
    return await readCube(source, needed, display);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    dataProblems.push(...e.problems);
    return undefined;
  }
}

/** Values, empty selections, overlaps and periods for one claim on its cube. */
function claimDataProblems(claim: Claim, i: number, source: SourceSpec, cube: Cube, file: string, place: PlaceOf, parsed: ParsedYaml): Problem[] {
  const problems: Problem[] = [];
  const periodCol = source.period;
  const periods = periodCol !== undefined ? orderPeriods(cube.values[periodCol] ?? []) : [];
  const owner = `claim "${claim.id}"`;

  /** Resolve one written value in column `col`; push a problem and return undefined when it is not in the data. */
  const valueOf = (col: string, v: FilterScalar, p: Path): string | undefined => {
    let text = String(v).trim();
    if (col === periodCol) {
      const r = resolvePeriod(v, periods);
      if (!r.ok) {
        problems.push({ file, ...place(p, 'value'), field: col, found: String(v), problem: `${r.reason}, in ${owner}`, fix: `Use one of the periods found: ${periods.join(', ')}` });
        return undefined;
      }
      text = r.period;
    }
    const known = cube.values[col] ?? [];
    const same = findName(text, known);
    if (same !== undefined) return same;
    const relative = periodsBack(v) !== undefined && col !== periodCol;
    // A relative word on a source without a period column is reported by the claims file's own rules.
    if (relative && periodCol === undefined) return undefined;
    problems.push({
      file,
      ...place(p, 'value'),
      field: col,
      found: text,
      problem: `no row of source "${source.id}" has this value in column "${col}", in ${owner}`,
      fix: fixFor(text, known, `values of "${col}"`) + (relative ? `; the words latest, previous and latest-N apply only to the period column${periodCol !== undefined ? ` "${periodCol}"` : ''}` : ''),
    });
    return undefined;
  };

  const resolveFilter = (pf: PlacedFilter): Resolved | undefined => {
    const out: Resolved = {};
    let ok = true;
    for (const [col, value] of Object.entries(pf.filter) as Array<[string, FilterValue]>) {
      const negate = typeof value === 'object' && !Array.isArray(value);
      const raw = negate ? value.not : value;
      const base: Path = negate ? [...pf.path, col, 'not'] : [...pf.path, col];
      const list = textsOf(raw);
      const texts = list.map((v, k) => valueOf(col, v, Array.isArray(raw) ? [...base, k] : base));
      if (texts.some((t) => t === undefined)) ok = false;
      out[col] = { values: new Set(texts.filter((t): t is string => t !== undefined)), negate };
    }
    return ok ? out : undefined;
  };

  const filters = filtersOf(claim, i);
  const resolved: Record<string, Resolved | undefined> = {};
  for (const [name, pf] of Object.entries(filters)) resolved[name] = resolveFilter(pf);
  const where = resolved.where;
  if (where === undefined) return problems;

  const cellsOf = (extra: Resolved): Set<Cell> => new Set(cube.cells.filter((c) => matchesResolved(c, { ...where, ...extra })));
  const noRows = (p: Path, what: string): void => {
    problems.push({
      file,
      ...place(p, 'key'),
      field: String(p[p.length - 1]),
      problem: `${what} of ${owner} matches no rows of source "${source.id}"${Object.keys(claim.where).length > 0 && p[p.length - 1] !== 'where' ? ' together with where' : ''}`,
      fix: 'Check that these values occur together in the data, or drop one of the filters',
    });
  };

  // Each selection must match some rows.
  const sets: Record<string, Set<Cell>> = {};
  for (const name of Object.keys(filters)) {
    if (name === 'where') continue;
    const r = resolved[name];
    if (r === undefined) continue;
    sets[name] = cellsOf(r);
    if (sets[name]!.size === 0) noRows(filters[name]!.path, `the selection under ${name}`);
  }
  if (Object.keys(sets).length === 0 && cellsOf({}).size === 0) noRows(filters.where!.path, 'the selection under where');

  // Two selections: separate, or one inside the other.
  if ((claim.kind === 'compare' || claim.kind === 'means' || claim.kind === 'equivalence') && sets.focus && sets.against && sets.focus.size > 0 && sets.against.size > 0) {
    const f = sets.focus;
    const a = sets.against;
    let shared = 0;
    for (const c of f) if (a.has(c)) shared += 1;
    if (shared > 0 && shared === f.size && shared === a.size) {
      problems.push({ file, ...place(filters.against!.path, 'key'), field: 'against', problem: `focus and against of ${owner} select the same rows`, fix: 'Change against to the group the focus is compared with, e.g. { region: ... } or { provider: { not: ... } }' });
    } else if (shared > 0 && shared < f.size && shared < a.size) {
      problems.push({
        file,
        ...place(filters.against!.path, 'key'),
        field: 'against',
        problem: `focus and against of ${owner} share ${shared} of their ${f.size} and ${a.size} groups of rows, but neither lies inside the other`,
        fix: 'Make them separate (e.g. against: { provider: { not: ... } }), or make one a part of the other so that it is compared with the rest',
      });
    }
  }

  // Periods of change and trend claims.
  if (periodCol !== undefined && (claim.kind === 'change' || claim.kind === 'gap-change' || claim.kind === 'trend')) {
    const periodAt = (key: string, k?: number): Path => (k === undefined ? ['claims', i, key] : ['claims', i, key, k]);
    const check = (v: FilterScalar, p: Path): string | undefined => {
      const t = valueOf(periodCol, v, p);
      if (t !== undefined && cellsOf({ [periodCol]: { values: new Set([t]), negate: false } }).size === 0) {
        problems.push({ file, ...place(p, 'value'), field: String(p[2]), found: t, problem: `${owner} has no rows in period ${t} once where is applied`, fix: 'Choose a period in which the selection has rows' });
      }
      return t;
    };
    if (claim.kind === 'change' || claim.kind === 'gap-change') {
      const from = check(claim.from, periodAt('from'));
      const toWritten = locate(parsed, ['claims', i, 'to']).value !== undefined;
      const to = check(claim.to, toWritten ? periodAt('to') : periodAt('from'));
      if (from !== undefined && from === to) {
        problems.push({ file, ...place(periodAt('from'), 'value'), field: 'from', found: from, problem: `${owner} compares period ${from} with itself`, fix: 'Make from an earlier period than to, e.g. from: previous' });
      } else if (from !== undefined && to !== undefined && periods.indexOf(from) > periods.indexOf(to) && orderIsInTime([from, to])) {
        problems.push({
          file,
          ...place(periodAt('from'), 'value'),
          field: 'from',
          found: String(claim.from),
          problem: `${owner} runs from ${from} to ${to}, but ${from} comes after ${to}: a change is measured from the earlier period to the later, so this one would report a fall as a rise`,
          fix: `Swap them: from: ${String(claim.to)}, to: ${String(claim.from)}`,
        });
      }
    } else if (Array.isArray(claim.periods)) {
      const listed = claim.periods.map((v, k) => check(v, periodAt('periods', k)));
      const at = listed.map((t) => (t === undefined ? -1 : periods.indexOf(t)));
      if (at.every((x) => x >= 0) && new Set(at).size === at.length && orderIsInTime(listed as string[]) && at.some((x, k) => k > 0 && x < at[k - 1]!)) {
        const sorted = claim.periods.map((w, k) => ({ w: String(w), x: at[k]! })).sort((a, b) => a.x - b.x).map((o) => o.w);
        problems.push({
          file,
          ...place(periodAt('periods'), 'value'),
          field: 'periods',
          found: listed.join(', '),
          problem: `${owner} lists its periods out of order (${listed.join(', ')}); a trend follows them in the order listed, so listed newest first a fall would be reported as a rise`,
          fix: `List them oldest first: periods: [${sorted.join(', ')}]`,
        });
      }
    } else if (claim.periods.last > periods.length) {
      problems.push({ file, ...place(periodAt('last'), 'value'), field: 'last', found: String(claim.periods.last), problem: `${owner} follows the last ${claim.periods.last} periods, but the data hold ${periods.length}`, fix: `Use last: ${Math.max(3, Math.min(periods.length, claim.periods.last))} or fewer, or add the earlier periods to the data` });
    }
  }
  return problems;
}

/** Run the check and print the outcome; returns the exit code (0 clean, 2 problems). */
export async function check(opts: CheckOptions): Promise<number> {
  const write = opts.write ?? ((t: string) => void process.stdout.write(t));
  const report = await checkClaimsFile(opts.claims);
  const ok = report.problems.length === 0;
  if (opts.json) {
    write(`${JSON.stringify({ file: report.file, ok, claims: report.claims ?? null, sources: report.sources ?? null, problems: report.problems, warnings: report.warnings ?? [], reading: report.reading ?? [] }, null, 2)}\n`);
    return ok ? 0 : 2;
  }
  // How the data were read comes first: a wrong guess about where a table ends explains problems that follow.
  for (const r of report.reading ?? []) write(`${r.file} (source "${r.source}"):\n${r.notes.map((n) => `  - ${n}`).join('\n')}\n`);
  // Warnings do not change the exit code: reading words is never certain, but a verdict under words it does not answer
  // misleads, so each is said, and the pack repeats it on the claim's page.
  const warnings = report.warnings ?? [];
  const warned = warnings.length > 0 ? `${warnings.map((w) => `warning: ${formatProblem(w)}`).join('\n\n')}\n\n` : '';
  const warnCount = `${warnings.length} warning${warnings.length === 1 ? '' : 's'} (a claim's words and its fields say different things; the pack repeats ${warnings.length === 1 ? 'it' : 'each'} on the claim's page)`;
  if (ok) {
    write(
      `${warned}${report.file}: ${report.claims} claim${report.claims === 1 ? '' : 's'}, ${report.sources} source${report.sources === 1 ? '' : 's'}, ${warnings.length === 0 ? 'all good' : `no problems, ${warnCount}`}.\n`,
    );
  } else {
    write(
      `${formatProblems(report.problems, 'with --json every one is listed')}\n\n${warned}${report.problems.length.toLocaleString('en-GB')} problem${report.problems.length === 1 ? '' : 's'} found in ${report.file}${warnings.length > 0 ? `, and ${warnCount}` : ''}.\n`,
    );
  }
  return ok ? 0 : 2;
}

/** A sentence's first letter made small, for a fix quoted inside another sentence. */
function lowerFirst(text: string): string {
  return text.charAt(0).toLowerCase() + text.slice(1);
}
