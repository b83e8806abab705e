/**
 * Rules that involve more than one field or the file system: confidence levels, unique claim ids, sources that
 * exist, one-sided tests with a direction, data files that exist and can be read. They run on the raw data even when
 * the schema found problems, checking only what is well-formed, so that every problem is reported in one pass.
 */
import { readdirSync, statSync } from 'node:fs';
import { basename, dirname, extname, resolve } from 'node:path';
import type { Problem } from '../errors.js';
import { CONFIDENCE_FORMS, readConfidence } from './confidence.js';
import { POINTS_FORMS, readPoints, readShare, readWorth, SHARE_FORMS, periodsBack, WORTH_FORMS, worthMeasureOf, type WorthMeasure } from './amounts.js';
import { closest, nfc } from '../suggest.js';
import { impossibleDate } from './dates.js';
import { samenessProblems } from './sameness.js';
import { fsReason, notOrdinaryProblem, otherThanFile } from '../files.js';
import { describeOwner } from './validate.js';
import { locate, type ParsedYaml } from './yaml.js';

/** Codes counted as agreeing when agree_codes is not written (the top two points of a five-point scale). */
export const DEFAULT_AGREE_CODES = [4, 5] as const;

export const DATA_EXTENSIONS: Record<string, 'csv' | 'xlsx'> = { '.csv': 'csv', '.xlsx': 'xlsx' };

/** The longest claim id: it names the claim's chart files (charts/<id>.vl.json), within a file name's 255 bytes. */
export const MAX_ID_LENGTH = 120;

/** The longest value a claim may select (a group's name, a question's code). */
export const MAX_VALUE_LENGTH = 400;

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => v !== null && typeof v === 'object' && !Array.isArray(v);

export function crossFieldProblems(parsed: ParsedYaml, file: string, claimsDir: string): Problem[] {
  const data = parsed.data;
  if (!isRec(data)) return [];
  const problems: Problem[] = [];
  const at = (path: Array<string | number>, prefer: 'key' | 'value' = 'value'): { line: number; column: number } => {
    const l = locate(parsed, path);
    const place = prefer === 'key' ? (l.key ?? l.value ?? l.nearest) : (l.value ?? l.key ?? l.nearest);
    return { line: place.line, column: place.column };
  };

  const checkConfidence = (path: Array<string | number>): void => {
    const raw = (path.length === 1 ? data : (data.claims as unknown[])[path[1] as number]) as Rec;
    if (!isRec(raw) || !('confidence' in raw)) return;
    const r = readConfidence(raw.confidence);
    if (r.ok) return;
    problems.push({
      file,
      ...at(path),
      field: 'confidence',
      found: r.written,
      problem: `the confidence level ${r.written} ${r.reason}`,
      fix: `Write it as ${CONFIDENCE_FORMS}; any level above 50% and up to 99.9% is accepted`,
    });
  };
  checkConfidence(['confidence']);
  problems.push(...samenessProblems(parsed, file));

  /** Shares (0.8, 80, "80%") and points (5, "5 points") written at `path`, range-checked with their own message. */
  const checkAmount = (owner: Rec, path: Array<string | number>, how: 'share' | 'share0' | 'points', what: string): void => {
    const key = String(path[path.length - 1]);
    if (!(key in owner)) return;
    const r = how === 'points' ? readPoints(owner[key]) : readShare(owner[key], how === 'share0');
    if (r.ok) return;
    problems.push({
      file,
      ...at(path),
      field: key,
      found: r.written,
      problem: `${what} ${r.written} ${r.reason}`,
      fix: how === 'points' ? `Write it as ${POINTS_FORMS}, e.g. ${key}: 5 points, or ${key}: 0.5 points for half a point` : `Write it as ${SHARE_FORMS}`,
    });
  };
  checkAmount(data, ['min_response_rate'], 'share', 'the minimum response rate');
  checkAmount(data, ['smallest_difference'], 'points', 'the smallest difference that matters,');
  problems.push(...worthProblems(data, file, at));
  if (typeof data.data_date === 'string' && impossibleDate(data.data_date) !== undefined) {
    problems.push({
      file,
      ...at(['data_date']),
      field: 'data_date',
      found: data.data_date,
      problem: `${data.data_date} is not a real date: ${impossibleDate(data.data_date)}`,
      fix: 'Write the date the data describe as YYYY-MM-DD, e.g. 2026-03-14',
    });
  }

  // Sources: file extension, existence, sheet only for workbooks, codes not both agreeing and not applicable.
  const sources = isRec(data.sources) ? data.sources : {};
  const sourceIds = Object.keys(sources);
  for (const id of sourceIds) {
    const src = sources[id];
    if (!isRec(src)) continue;
    if (typeof src.file === 'string' && src.file !== '') {
      const ext = extname(src.file).toLowerCase();
      const fileAt = at(['sources', id, 'file']);
      if (DATA_EXTENSIONS[ext] === undefined && !isFolder(resolve(claimsDir, src.file))) {
        problems.push({
          file,
          ...fileAt,
          field: 'file',
          found: src.file,
          problem: `warrant reads .csv and .xlsx files, and ${ext === '' ? 'this file name has no extension' : `"${ext}" is neither`}`,
          fix:
            ext === '.xls' || ext === '.ods' || ext === '.numbers'
              ? 'Save the spreadsheet as .xlsx (Excel workbook) and point file at the saved copy'
              : 'Save the data as .csv or .xlsx and point file at that copy',
        });
      } else {
        problems.push(...fileProblems(src.file, claimsDir, file, fileAt));
        if (DATA_EXTENSIONS[ext] === 'csv' && 'sheet' in src) {
          problems.push({
            file,
            ...at(['sources', id, 'sheet'], 'key'),
            field: 'sheet',
            problem: `source "${id}" names a sheet, but a .csv file has no sheets`,
            fix: 'Delete the sheet line, or point file at the .xlsx workbook',
          });
        }
      }
    }
    const agreeCodes: unknown[] = Array.isArray(src.agree_codes) ? src.agree_codes : [...DEFAULT_AGREE_CODES];
    if (Array.isArray(src.not_applicable)) {
      const both = agreeCodes.filter((c) => (src.not_applicable as unknown[]).includes(c));
      if (both.length > 0) {
        problems.push({
          file,
          ...at(['sources', id, 'not_applicable']),
          field: 'not_applicable',
          found: both.join(', '),
          problem: `code ${both.join(', ')} is listed both as agreeing and as not applicable in source "${id}"${Array.isArray(src.agree_codes) ? '' : ' (agree_codes is not written, so the default [4, 5] applies)'}`,
          fix: Array.isArray(src.agree_codes) ? 'Keep each code in one list only' : 'Remove it from not_applicable, or write agree_codes without it',
        });
      }
    }
  }

  // Claims: confidence, unique ids, named source, one-sided needs a direction.
  const claims = Array.isArray(data.claims) ? data.claims : [];
  const firstById = new Map<string, { line: number; column: number }>();
  claims.forEach((c, i) => {
    if (!isRec(c)) return;
    checkConfidence(['claims', i, 'confidence']);
    // A value thousands of characters long is text pasted by mistake, not a group's name; drawn as a chart's label
    // or a table's word it would cost the pack seconds and hundreds of MB, wrapped a character at a time.
    for (const [path, f] of claimFilters(c, ['claims', i])) {
      for (const [col, v] of Object.entries(f)) {
        const values = Array.isArray(v) ? v : isRec(v) && 'not' in v ? (Array.isArray(v.not) ? v.not : [v.not]) : [v];
        const long = values.find((x): x is string => typeof x === 'string' && x.length > MAX_VALUE_LENGTH);
        if (long === undefined) continue;
        problems.push({
          file,
          ...at([...path, col]),
          field: col,
          found: `${long.slice(0, 40)}… (${long.length} characters)`,
          problem: `the value selected in ${col} is ${long.length} characters long, longer than any name of a group warrant reads (at most ${MAX_VALUE_LENGTH} characters)`,
          fix: `Check the value: it may be a paragraph pasted by mistake. Write the name of the group as the data give it in ${col}`,
        });
      }
    }
    if (typeof c.id === 'string' && c.id.length > MAX_ID_LENGTH) {
      // Each claim's chart files are named by its id (charts/<id>.vl.json): a file name has at most 255 bytes.
      problems.push({
        file,
        ...at(['claims', i, 'id']),
        field: 'id',
        found: `${c.id.slice(0, 40)}… (${c.id.length} characters)`,
        problem: `the claim id is ${c.id.length} characters long; a claim's id names its chart files in the pack (charts/<id>.svg), and a file's name may be at most 255 bytes on most disks`,
        fix: `Give the claim a short id, at most ${MAX_ID_LENGTH} characters, e.g. ${c.id.slice(0, 24).replace(/[-_]+$/, '')}`,
      });
    } else if (typeof c.id === 'string' && c.id !== '') {
      const here = at(['claims', i, 'id']);
      const first = firstById.get(c.id);
      if (first) {
        problems.push({
          file,
          ...here,
          field: 'id',
          found: c.id,
          problem: `the claim id "${c.id}" is used twice: here (line ${here.line}) and at line ${first.line}, column ${first.column}`,
          fix: 'Give each claim its own id, e.g. by adding a year or a place to one of them',
        });
      } else {
        firstById.set(c.id, here);
      }
    }
    if (typeof c.source === 'string' && c.source !== '') {
      if (sourceIds.length > 0 && !sourceIds.includes(c.source)) {
        const guess = closest(c.source, sourceIds);
        problems.push({
          file,
          ...at(['claims', i, 'source']),
          field: 'source',
          found: c.source,
          problem: `${describeOwner(data, ['claims', i])} names a source that is not defined under sources`,
          fix: guess !== undefined ? `Did you mean "${guess}"? Use one of: ${sourceIds.join(', ')}` : `Use one of: ${sourceIds.join(', ')}, or add "${c.source}" under sources`,
        });
      }
    } else if (!('source' in c) && sourceIds.length > 1) {
      problems.push({
        file,
        ...at(['claims', i]),
        field: 'source',
        problem: `${describeOwner(data, ['claims', i])} does not say which source it uses, and there are ${sourceIds.length}`,
        fix: `Add source: followed by one of ${sourceIds.join(', ')}`,
      });
    }
    if (c.test === 'one-sided' && (c.expect === 'different' || c.expect === 'any' || c.kind === 'crosstab')) {
      const directions: Record<string, string> = { association: 'positive or negative', trend: 'rising or falling' };
      problems.push({
        file,
        ...at(['claims', i, 'test']),
        field: 'test',
        found: 'one-sided',
        problem:
          c.kind === 'crosstab'
            ? `${describeOwner(data, ['claims', i])} asks for a one-sided test, but a crosstab claim (related or not) has no direction`
            : `${describeOwner(data, ['claims', i])} asks for a one-sided test but expects "${String(c.expect)}", which has no direction`,
        fix:
          c.kind === 'crosstab'
            ? 'Delete the test line (crosstab claims are always two-sided)'
            : `Set expect to ${directions[String(c.kind)] ?? 'lower or higher'}, or use test: two-sided`,
      });
    }
    const claimPath = ['claims', i] as Array<string | number>;
    checkAmount(c, [...claimPath, 'min_response_rate'], 'share', 'the minimum response rate');
    checkAmount(c, [...claimPath, 'smallest_difference'], 'points', 'the smallest difference that matters,');
    if (c.kind === 'target' || c.kind === 'every') checkAmount(c, [...claimPath, 'value'], 'share0', 'the value');
    if (c.kind === 'equivalence') checkAmount(c, [...claimPath, 'margin'], 'points', 'the margin');

    // A change claim with focus and against follows the gap between the two selections; it needs both, and only it
    // can say that a gap narrowed or widened.
    if (c.kind === 'change') {
      const gap = 'focus' in c || 'against' in c;
      if (gap && !('focus' in c && 'against' in c)) {
        const has = 'focus' in c ? 'focus' : 'against';
        const lacks = has === 'focus' ? 'against' : 'focus';
        problems.push({
          file,
          ...at([...claimPath, has], 'key'),
          field: lacks,
          problem: `${describeOwner(data, claimPath)} gives ${has} but no ${lacks}: a change claim with focus and against follows the gap between two selections, and needs both`,
          fix: has === 'focus'
            ? 'Add against: the selection the focus is measured against (or against: rest for everyone else under where); or, to follow one group, put its filter in where and delete focus'
            : 'Add focus: the selection the gap is about; or, to follow one group, put its filter in where and delete against',
        });
      }
      if (!gap && (c.expect === 'narrowed' || c.expect === 'widened')) {
        problems.push({
          file,
          ...at([...claimPath, 'expect']),
          field: 'expect',
          found: String(c.expect),
          problem: `${describeOwner(data, claimPath)} expects the gap ${String(c.expect)}, but names no two selections: ${String(c.expect)} is about the gap between focus and against`,
          fix: 'Add focus and against (the two groups whose gap is followed, e.g. focus: { Mode: Part-time } and against: { Mode: Full-time }); for one group\'s rate use expect: lower, higher or different',
        });
      }
      if (gap && c.test === 'one-sided' && (c.expect === 'narrowed' || c.expect === 'widened')) {
        problems.push({
          file,
          ...at([...claimPath, 'test']),
          field: 'test',
          found: 'one-sided',
          problem: `${describeOwner(data, claimPath)} asks for a one-sided test of a gap that ${String(c.expect)}: which group is ahead is read from the data, so the two tests on the gap's size are always held to the two-sided level`,
          fix: 'Delete the test line; or, to test one direction of focus minus against fixed in advance, use expect: lower or higher with test: one-sided',
        });
      }
    }
    // A rank claim's focus is one unit: one value of the units column (units defaults to the focus's one column).
    if (c.kind === 'rank' && isRec(c.focus)) {
      const cols = Object.keys(c.focus);
      const units = typeof c.units === 'string' ? c.units : undefined;
      const value = units !== undefined ? c.focus[units] : cols.length === 1 ? c.focus[cols[0] as string] : undefined;
      if (units === undefined && cols.length !== 1) {
        problems.push({
          file,
          ...at([...claimPath, 'focus']),
          field: 'focus',
          problem: `${describeOwner(data, claimPath)} ranks a unit, but its focus names ${cols.length === 0 ? 'no column' : `${cols.length} columns (${cols.join(', ')})`}, so which column holds the units is not clear`,
          fix: cols.length === 0 ? 'Write focus: { Institution: Quarrendell } (the column of the units and the one unit the claim is about)' : `Add units: the column whose values are ranked (e.g. units: ${cols[0] as string}), and move the other filters into where`,
        });
      } else if (units !== undefined && (cols.length !== 1 || cols[0] !== units)) {
        problems.push({
          file,
          ...at([...claimPath, 'focus']),
          field: 'focus',
          found: cols.join(', '),
          problem: `${describeOwner(data, claimPath)} ranks the values of ${units}, but its focus ${cols.includes(units) ? 'also filters on other columns' : `does not name a value of ${units}`}`,
          fix: `Write focus: { ${units}: <the unit the claim is about> } and put any other filter in where`,
        });
      } else if (value === null || typeof value === 'object') {
        problems.push({
          file,
          ...at([...claimPath, 'focus']),
          field: 'focus',
          problem: `${describeOwner(data, claimPath)} must name one unit as its focus, not a list or an exclusion: a claim that a group of units is highest is not a rank claim`,
          fix: `Name one unit, e.g. focus: { ${units ?? (cols[0] as string)}: ${Array.isArray(value) ? String(value[0]) : 'Quarrendell'} }; to claim that a group is above the rest, use kind: compare with against: rest`,
        });
      }
    }
    if (c.kind === 'trend' && ('periods' in c) === ('last' in c)) {
      problems.push({
        file,
        ...at(claimPath),
        field: 'periods',
        problem: 'periods' in c
          ? `${describeOwner(data, claimPath)} gives both periods and last`
          : `${describeOwner(data, claimPath)} says neither which periods to follow (periods) nor how many of the latest (last)`,
        fix: 'periods' in c ? 'Keep one of them: periods: [2024, 2025, 2026] or last: 3' : 'Add periods: [2024, 2025, 2026] (oldest first), or last: 3',
      });
    }
    if (c.kind === 'association' && Array.isArray(c.controls)) {
      c.controls.forEach((ctl, j) => {
        if (isRec(ctl) && ('where' in ctl) === ('column' in ctl)) {
          problems.push({
            file,
            ...at([...claimPath, 'controls', j]),
            field: 'controls',
            problem: 'where' in ctl
              ? `control ${j + 1} of ${describeOwner(data, claimPath)} gives both where and column`
              : `control ${j + 1} of ${describeOwner(data, claimPath)} says neither what to measure (where) nor which column (column)`,
            fix: 'Write each control as { label: ..., where: { question: Q03 } } or { label: ..., column: NAME }',
          });
        }
      });
    }

    // What depends on the claim's source: a period column, measure columns.
    const sourceId = typeof c.source === 'string' ? c.source : sourceIds.length === 1 ? sourceIds[0] : undefined;
    const src = sourceId !== undefined && isRec(sources[sourceId]) ? (sources[sourceId] as Rec) : undefined;
    if (src === undefined) return;
    const hasPeriod = typeof src.period === 'string' && src.period !== '';
    if (!hasPeriod && (c.kind === 'change' || c.kind === 'trend')) {
      problems.push({
        file,
        ...at([...claimPath, 'kind']),
        field: 'kind',
        found: String(c.kind),
        problem: `${describeOwner(data, claimPath)} compares periods, but source "${sourceId}" does not say which column holds the period`,
        fix: `Add period: followed by the column name (such as Year) to source "${sourceId}" under sources`,
      });
    }
    if (!hasPeriod) {
      for (const [path, value] of relativeWords(c, claimPath)) {
        problems.push({
          file,
          ...at(path),
          field: String(typeof path[path.length - 1] === 'number' ? path[path.length - 2] : path[path.length - 1]),
          found: String(value),
          problem: `"${String(value)}" names a period relative to the newest, but source "${sourceId}" does not say which column holds the period`,
          fix: `Add period: followed by the column name (such as Year) to source "${sourceId}", or write the period itself, e.g. 2026`,
        });
      }
    }
    // A period column that also plays another part (respondents, a question) is refused at the source; no claim can name it.
    const otherParts = [src.respondents, src.agree, src.agree_percent, src.population, ...(Array.isArray(src.questions) ? src.questions : []), ...(Array.isArray(src.numeric) ? src.numeric : [])];
    if (hasPeriod && !otherParts.includes(src.period)) problems.push(...unpinnedPeriodProblems(c, claimPath, String(src.period), String(sourceId), file, at, describeOwner(data, claimPath)));
    for (const [path, m] of measures(c, claimPath)) {
      if (m === 'mean' && src.shape === 'summary') {
        problems.push({
          file,
          ...at(path),
          field: String(path[path.length - 1]),
          found: 'mean',
          problem: `a mean score needs one row per respondent, but source "${sourceId}" is of shape summary`,
          fix: `Use a source of shape respondents, or a numeric column of "${sourceId}" with { column: NAME }`,
        });
      } else if (isRec(m) && typeof m.column === 'string') {
        const numeric = Array.isArray(src.numeric) ? (src.numeric as unknown[]).map(String) : [];
        if (src.shape !== 'summary' || !numeric.includes(m.column)) {
          const guess = closest(m.column, numeric);
          problems.push({
            file,
            ...at([...path, 'column']),
            field: 'column',
            found: m.column,
            problem: src.shape === 'summary'
              ? `the column "${m.column}" is not listed under numeric in source "${sourceId}"`
              : `a numeric column measure needs a source of shape summary, and source "${sourceId}" is of shape respondents`,
            fix: src.shape !== 'summary'
              ? 'Use measure: mean for answer scores, or a summary source that lists the column under numeric'
              : guess !== undefined
                ? `Did you mean "${guess}"? Or add "${m.column}" to numeric in source "${sourceId}"`
                : `Add numeric: [${m.column}] to source "${sourceId}"`,
          });
        }
      }
    }
  });
  return problems;
}

type Path = Array<string | number>;

/** The filters of a claim, with their paths: where, focus, against, select, x, y and each control's where. */
export function claimFilters(c: Rec, claimPath: Path): Array<[Path, Rec]> {
  const out: Array<[Path, Rec]> = [];
  for (const key of ['where', 'focus', 'against', 'select', 'x', 'y']) {
    if (isRec(c[key])) out.push([[...claimPath, key], c[key] as Rec]);
  }
  if (Array.isArray(c.controls)) {
    c.controls.forEach((ctl, j) => {
      if (isRec(ctl) && isRec(ctl.where)) out.push([[...claimPath, 'controls', j, 'where'], ctl.where]);
    });
  }
  return out;
}

/** Every relative period word written in a claim (filters, from, to, periods), with its path. */
export function relativeWords(c: Rec, claimPath: Path): Array<[Path, string]> {
  const out: Array<[Path, string]> = [];
  const visit = (path: Path, v: unknown): void => {
    if (Array.isArray(v)) v.forEach((x, k) => visit([...path, k], x));
    else if (isRec(v) && 'not' in v) visit([...path, 'not'], v.not);
    else if (periodsBack(v) !== undefined) out.push([path, String(v)]);
  };
  for (const [path, f] of claimFilters(c, claimPath)) for (const [col, v] of Object.entries(f)) visit([...path, col], v);
  for (const key of ['from', 'to', 'periods']) if (key in c) visit([...claimPath, key], c[key]);
  return out;
}

/** The measures written in a claim (x_measure, y_measure, measure, controls), with their paths. */
function measures(c: Rec, claimPath: Path): Array<[Path, unknown]> {
  const out: Array<[Path, unknown]> = [];
  for (const key of ['x_measure', 'y_measure', 'measure']) if (key in c) out.push([[...claimPath, key], c[key]]);
  if (Array.isArray(c.controls)) {
    c.controls.forEach((ctl, j) => {
      if (!isRec(ctl)) return;
      if (typeof ctl.column === 'string') out.push([[...claimPath, 'controls', j], { column: ctl.column }]);
      if ('measure' in ctl) out.push([[...claimPath, 'controls', j, 'measure'], ctl.measure]);
    });
  }
  return out;
}

/** True when the path names an existing folder (a folder is reported as such, whatever its name ends in). */
function isFolder(abs: string): boolean {
  try {
    return statSync(abs).isDirectory();
  } catch {
    return false;
  }
}

/** The data file must exist and be a file; suggest a near-miss name in the same folder. */
function fileProblems(written: string, claimsDir: string, file: string, place: { line: number; column: number }): Problem[] {
  const abs = resolve(claimsDir, written);
  let stat;
  try {
    stat = statSync(abs);
  } catch (e) {
    // A loop of links, a file where a folder should be, a folder that may not be opened: not a misspelt name.
    const code = (e as { code?: string }).code;
    const reason = code !== 'ENOENT' ? fsReason(e) : undefined;
    if (reason !== undefined) {
      const fixes: Record<string, string> = {
        ELOOP: 'Check the symbolic links in the path: one leads back to itself; point file at the data file itself',
        ENOTDIR: 'Check each folder named in the path: one of them is a file',
        ENAMETOOLONG: 'Use a shorter path or shorter folder and file names',
      };
      return [{ file, ...place, field: 'file', found: written, problem: `the data file ${abs} cannot be opened: ${reason}`, fix: fixes[code ?? ''] ?? 'Allow access to the file and its folder, or copy the file somewhere you can use' }];
    }
    let hint = '';
    try {
      const siblings = readdirSync(dirname(abs));
      const guess = closest(basename(abs), siblings);
      if (guess !== undefined) hint = `; there is a "${guess}" in that folder`;
    } catch {
      hint = '; its folder does not exist either';
    }
    return [
      {
        file,
        ...place,
        field: 'file',
        found: written,
        problem: `the data file was not found at ${abs}${hint}`,
        fix: `Check the spelling; paths are read relative to the folder of the claims file (${claimsDir})`,
      },
    ];
  }
  const other = otherThanFile(stat);
  if (other !== undefined && !stat.isDirectory()) return [notOrdinaryProblem(abs, other, { file, ...place, field: 'file', found: written }, 'data file')];
  if (stat.isDirectory()) {
    let inside: string | undefined;
    try {
      inside = readdirSync(abs).find((n) => DATA_EXTENSIONS[extname(n).toLowerCase()] !== undefined);
    } catch {
      inside = undefined;
    }
    const folder = written.replace(/[\\/]+$/, '');
    return [
      {
        file,
        ...place,
        field: 'file',
        found: written,
        problem: `${abs} is a folder, not a data file`,
        fix:
          inside !== undefined
            ? `Point file at the data file inside the folder, e.g. ${folder}/${inside}`
            : 'Point file at a .csv or .xlsx file; this folder holds none',
      },
    ];
  }
  return [];
}

const WORTH_WORDS: Record<WorthMeasure, string> = {
  rates: 'a gap between rates',
  mean_scores: 'a difference in mean scores',
  correlations: 'a correlation',
};

/**
 * `worth_reporting`: at the top of the file, a mapping of sizes per measure (rates, mean_scores, correlations); on a
 * claim, one size in the unit of the claim's measure. Each size is range-checked with its own message; a claim kind
 * whose "not supported" is not split (trend, crosstab, equivalence, estimate) is told so; a claim may not set both
 * its own smallest_difference and worth_reporting, and the file may not set a rates size that its smallest_difference
 * would always override.
 */
function worthProblems(data: Rec, file: string, at: (path: Array<string | number>, prefer?: 'key' | 'value') => { line: number; column: number }): Problem[] {
  const problems: Problem[] = [];
  const example = 'worth_reporting: { rates: 5 points, mean_scores: 0.2, correlations: 0.3 }';
  const size = (raw: unknown, measure: WorthMeasure, path: Array<string | number>, owner: string): void => {
    const r = readWorth(raw, measure);
    if (r.ok) return;
    problems.push({
      file,
      ...at(path),
      field: 'worth_reporting',
      found: r.written,
      problem: `the size of ${WORTH_WORDS[measure]} worth reporting ${r.written} ${r.reason}, in ${owner}`,
      fix: `Write it as ${WORTH_FORMS[measure]}, e.g. ${measure === 'rates' ? '5 points' : measure === 'mean_scores' ? '0.2' : '0.3'}`,
    });
  };
  if ('worth_reporting' in data) {
    const top = data.worth_reporting;
    if (!isRec(top)) {
      problems.push({
        file,
        ...at(['worth_reporting']),
        field: 'worth_reporting',
        found: typeof top === 'string' || typeof top === 'number' ? String(top) : JSON.stringify(top) ?? String(top),
        problem: 'at the top of the claims file, worth_reporting gives a size for each measure, not one size',
        fix: `Write ${example} (any of the three), or move the single size onto a claim`,
      });
    } else {
      for (const m of ['rates', 'mean_scores', 'correlations'] as const) {
        if (typeof top[m] === 'number' || typeof top[m] === 'string') size(top[m], m, ['worth_reporting', m], 'the claims file');
      }
      if ('smallest_difference' in data && 'rates' in top) {
        problems.push({
          file,
          ...at(['worth_reporting', 'rates'], 'key'),
          field: 'worth_reporting',
          found: String(top.rates),
          problem: `worth_reporting gives a size for rates, but smallest_difference (line ${at(['smallest_difference']).line}) already sets the size that counts for every claim on rates, so it would never be used`,
          fix: 'Remove rates from worth_reporting, or remove smallest_difference if a smaller significant gap should still count as support',
        });
      }
    }
  }
  const claims = Array.isArray(data.claims) ? data.claims : [];
  claims.forEach((c, i) => {
    if (!isRec(c) || !('worth_reporting' in c)) return;
    const path = ['claims', i, 'worth_reporting'];
    const owner = describeOwner(data, ['claims', i]);
    const measure = worthMeasureOf(c.kind);
    const raw = c.worth_reporting;
    if (isRec(raw)) {
      problems.push({
        file,
        ...at(path),
        field: 'worth_reporting',
        found: 'a mapping',
        problem: `on a claim, worth_reporting is one size in the claim's own measure, but ${owner} gives a mapping`,
        fix: measure ? `Write one size, e.g. worth_reporting: ${measure === 'rates' ? '5 points' : measure === 'mean_scores' ? '0.2' : '0.3'}, or move the mapping to the top of the file` : 'Move the mapping to the top of the file',
      });
      return;
    }
    if (typeof c.kind === 'string' && measure === undefined) {
      const why: Record<string, string> = {
        equivalence: 'its margin already sets the size that counts',
        estimate: 'an estimate tests no claim',
        trend: 'a trend claim has no interval for its size, so its "not supported" is not split',
        crosstab: 'a crosstab claim has no interval for its size, so its "not supported" is not split',
      };
      problems.push({
        file,
        ...at(path, 'key'),
        field: 'worth_reporting',
        problem: `worth_reporting does not apply to ${owner} (kind ${c.kind}): ${why[c.kind] ?? 'its verdict is not split'}`,
        fix: 'Remove worth_reporting from this claim',
      });
      return;
    }
    if ('smallest_difference' in c) {
      problems.push({
        file,
        ...at(path, 'key'),
        field: 'worth_reporting',
        problem: `${owner} sets both smallest_difference (line ${at(['claims', i, 'smallest_difference']).line}) and worth_reporting; the smallest difference that matters is already the size worth reporting`,
        fix: 'Keep one: smallest_difference when a smaller significant difference should not count as support, worth_reporting when it only decides between ruled out and inconclusive',
      });
      return;
    }
    if (measure !== undefined) size(raw, measure, path, owner);
  });
  return problems;
}

/**
 * A claim on a source with a period column must say which periods each of its selections covers: in `where`, in the
 * selection itself, or by making the period a grouping (association units, crosstab rows or columns). Without it a
 * selection silently pools every period in the data (next year's release adds one more), counting several surveys'
 * respondents as one group, and the pack's labels name no period. Change and trend claims set their periods
 * themselves. Listing periods (`Year: [previous, latest]`, `{ not: 2023 }`) pools them on purpose.
 */
function unpinnedPeriodProblems(
  c: Rec,
  claimPath: Path,
  period: string,
  sourceId: string,
  file: string,
  at: (path: Path, prefer?: 'key' | 'value') => { line: number; column: number },
  owner: string,
): Problem[] {
  const kind = c.kind;
  if (typeof kind !== 'string' || kind === 'change' || kind === 'trend') return [];
  const same = (name: unknown): boolean => typeof name === 'string' && nfc(name.trim()).toLowerCase() === nfc(period).toLowerCase();
  const names = (f: unknown): boolean => isRec(f) && Object.keys(f).some(same);
  if (names(c.where)) return [];
  const grouped = (key: string): boolean => (Array.isArray(c[key]) ? (c[key] as unknown[]) : [c[key]]).some(same);
  const missing: Array<{ path: Path; what: string; key: string }> = [];
  let extra = '';
  if (kind === 'compare' || kind === 'means' || kind === 'equivalence') {
    if (c.against === 'rest') {
      // The rest is everything else under where: only where can keep it to the focus's periods.
      missing.push({ path: [...claimPath, 'against'], what: 'against: rest', key: 'against' });
    } else {
      for (const key of ['focus', 'against']) if (key in c && !names(c[key])) missing.push({ path: [...claimPath, key], what: `the selection under ${key}`, key });
    }
  } else if (kind === 'target' || kind === 'estimate') {
    if ('select' in c && !names(c.select)) missing.push({ path: [...claimPath, 'select'], what: 'the selection under select', key: 'select' });
  } else if (kind === 'association') {
    if (grouped('units')) return [];
    for (const key of ['x', 'y']) if (key in c && !names(c[key])) missing.push({ path: [...claimPath, key], what: `the measure under ${key}`, key });
    if (Array.isArray(c.controls)) {
      c.controls.forEach((ctl, j) => {
        if (!isRec(ctl)) return;
        if ('column' in ctl || !names(ctl.where)) missing.push({ path: [...claimPath, 'controls', j], what: `control ${j + 1}`, key: 'controls' });
      });
    }
    extra = `, or make each unit a period by adding ${period} to units`;
  } else if (kind === 'rank' || kind === 'every') {
    if (grouped('units') || (kind === 'rank' && !('units' in c) && names(c.focus))) return [];
    missing.push({ path: claimPath, what: 'the ranking', key: 'where' });
  } else if (kind === 'crosstab') {
    if (grouped('rows') || grouped('columns')) return [];
    missing.push({ path: claimPath, what: 'the table', key: 'where' });
    extra = `, or make the periods the table's rows (rows: ${period})`;
  }
  if (missing.length === 0) return [];
  // against: rest is everything else under where, so only where can keep it to the focus's periods.
  const first = missing[0]!;
  const one = missing.length === 1 && !(first.key === 'against' && c.against === 'rest');
  const single = kind === 'target' || kind === 'estimate';
  const whole = kind === 'crosstab' || kind === 'rank' || kind === 'every' || single || !one;
  const place = whole ? ('where' in c ? at([...claimPath, 'where'], 'key') : at(claimPath)) : at(first.path, 'key');
  const which = whole ? owner : `${first.what} of ${owner}`;
  const inWords = single ? 'where or select' : whole ? 'where' : `where or ${first.key === 'controls' ? 'the control' : `under ${first.key}`}`;
  return [
    {
      file,
      ...place,
      field: whole ? 'where' : first.key,
      problem: `${which} does not say which period it covers: source "${sourceId}" has its periods in column "${period}", and with no ${period} in ${inWords} it pools every period in the data (one more with each new release), counting the respondents of several surveys as one group`,
      fix: `Add ${period}: latest to where (the newest period in the data), or list the periods to pool on purpose, e.g. ${period}: [previous, latest]${extra}`,
    },
  ];
}
