/**
 * `warrant init data.xlsx|data.csv [--sheet NAME] [--out claims.yaml] [--force]`: look at a data file and write a
 * starter claims file: the schema header line, a source block with the measures guessed from the column names and
 * values, a list of the columns and their values, and one commented example of every kind of claim, written with
 * the file's own column names and values so that uncommenting an example gives a claim `warrant check` accepts.
 */
import { existsSync, statSync } from 'node:fs';
import { basename, dirname, extname, join, relative, resolve, sep } from 'node:path';
import { DATA_EXTENSIONS } from '../claims/rules.js';
import { LIST_LIMIT, scanTable, type ColumnScan, type TableScan } from '../claims/scan.js';
import { claimsSchemaPath } from '../claims/schema.js';
import { displayPathFor } from '../claims/read.js';
import { PERIOD_NAME } from '../claims/periods.js';
import { InputError } from '../errors.js';
import { writeFailure, writeWhole } from '../files.js';

export interface InitOptions {
  /** The data file (.csv or .xlsx). */
  data: string;
  /** Worksheet of an .xlsx file (default: the sheet that holds the table). */
  sheet?: string;
  /** The claims file to write (default: claims.yaml in the current folder). */
  out?: string;
  /** Overwrite an existing file. */
  force?: boolean;
  write?: (text: string) => void;
}

/** What was guessed about the file. */
export interface Guess {
  shape: 'summary' | 'respondents';
  respondents?: string;
  agree?: string;
  agreePercent?: string;
  population?: string;
  period?: string;
  questions: string[];
  notApplicable: number[];
  numeric: string[];
  /** Columns to select on, most useful first. */
  dimensions: ColumnScan[];
  /** Texts in columns of counts that look like the release's own markers for withheld cells (written as suppressed:). */
  ownMarkers: string[];
}

/**
 * The few short texts in a column of whole numbers that are neither numbers nor common markers, when they look like
 * the release's own markers for withheld cells: at most three of them, each at most six characters, in a column at
 * least four fifths of whose cells are numbers. Common practice; init says it assumed this.
 */
export function ownMarkersOf(c: ColumnScan): string[] | undefined {
  const others = Object.keys(c.otherTexts);
  if (others.length === 0 || others.length > 3 || c.numbers === 0 || c.numbers < 0.8 * c.filled) return undefined;
  if (others.some((t) => t.length > 6)) return undefined;
  return others.sort();
}

const RESPONDENTS = /respon|^n$|^base$|answered|^count$|replies/i;
const PERCENT = /%|percent|pct/i;
const AGREE = /agree|positive|satisf/i;
const POPULATION = /eligible|population|cohort|invited|headcount/i;
const ID = /^(id|.*[ _-]id|respondent|key)$/i;

/** Integer answer codes: at least three of 1-5 and nothing else but a few not-applicable codes (0, 6, 9, 99). */
function answerCodes(c: ColumnScan): { na: number[] } | undefined {
  if (!c.integer || c.more || c.distinct > 8) return undefined;
  const codes = c.values.map(Number);
  const inScale = codes.filter((x) => x >= 1 && x <= 5);
  const others = codes.filter((x) => x < 1 || x > 5);
  if (inScale.length < 3 || others.some((x) => ![0, 6, 9, 99].includes(x))) return undefined;
  return { na: others.sort((a, b) => a - b) };
}

/** Guess measures and dimensions from the scanned columns. */
export function guessMeasures(scan: TableScan): Guess {
  // A column of counts with a few texts of its own (the release's markers for withheld cells) is read as counts.
  const cols = scan.columns.map((c) => (ownMarkersOf(c) !== undefined && c.wholeNumbers ? { ...c, integer: true, numeric: true } : c));
  const find = (re: RegExp, ok: (c: ColumnScan) => boolean, not: Array<string | undefined> = []): string | undefined =>
    cols.find((c) => re.test(c.name) && ok(c) && !not.includes(c.name))?.name;
  const questions: string[] = [];
  const na = new Set<number>();
  for (const c of cols) {
    const codes = answerCodes(c);
    if (codes && !PERIOD_NAME.test(c.name) && !RESPONDENTS.test(c.name)) {
      questions.push(c.name);
      codes.na.forEach((x) => na.add(x));
    }
  }
  const respondents = find(RESPONDENTS, (c) => c.integer);
  const shape = questions.length > 0 && respondents === undefined ? 'respondents' : 'summary';
  const guess: Guess = { shape, questions: shape === 'respondents' ? questions : [], notApplicable: shape === 'respondents' ? [...na] : [], numeric: [], dimensions: [], ownMarkers: [] };
  const used = new Set<string>();
  if (shape === 'summary') {
    guess.respondents = respondents;
    const percent = find(PERCENT, (c) => c.filled > 0, [respondents]);
    const agree = find(AGREE, (c) => c.integer && !PERCENT.test(c.name), [respondents]);
    if (agree !== undefined) guess.agree = agree;
    else if (percent !== undefined) guess.agreePercent = percent;
    guess.population = find(POPULATION, (c) => c.integer, [respondents, agree]);
    for (const n of [guess.respondents, guess.agree, guess.agreePercent, guess.population]) if (n !== undefined) used.add(n);
  } else {
    questions.forEach((q) => used.add(q));
  }
  guess.period = find(PERIOD_NAME, (c) => c.filled > 0 && !c.more && c.distinct <= LIST_LIMIT);
  if (guess.period !== undefined) used.add(guess.period);
  for (const c of cols) {
    if (used.has(c.name) || c.filled === 0) continue;
    const categorical = !c.more && c.distinct >= 2 && c.distinct <= LIST_LIMIT && !ID.test(c.name);
    if (categorical && !(c.numeric && !c.integer)) guess.dimensions.push(c);
    else if (shape === 'summary' && c.numeric) guess.numeric.push(c.name);
  }
  for (const k of ['respondents', 'agree', 'agreePercent', 'population', 'period'] as const) if (guess[k] === undefined) delete guess[k];
  // Own markers matter only where counts are read (a summary source's measures).
  const measures = [guess.respondents, guess.agree, guess.agreePercent, guess.population, ...guess.numeric];
  if (shape === 'summary') guess.ownMarkers = [...new Set(cols.filter((c) => measures.includes(c.name)).flatMap((c) => ownMarkersOf(c) ?? []))].sort();
  return guess;
}

/** A YAML scalar written so that it reads back as the same text (quoted when plain text would not). */
export function yamlScalar(v: string): string {
  const plain = /^[A-Za-z0-9][A-Za-z0-9 ._/()'-]*$/.test(v) && !/^(true|false|yes|no|on|off|null|~)$/i.test(v) && !/\s$/.test(v) && !/: | #/.test(v);
  return plain ? v : JSON.stringify(v);
}

/** A flow mapping { col: value }. */
function flow(pairs: Array<[string, string | string[] | { not: string }]>): string {
  const one = (v: string | string[] | { not: string }): string =>
    Array.isArray(v) ? `[${v.map(yamlScalar).join(', ')}]` : typeof v === 'object' ? `{ not: ${yamlScalar(v.not)} }` : yamlScalar(v);
  return `{ ${pairs.map(([k, v]) => `${yamlScalar(k)}: ${one(v)}`).join(', ')} }`;
}

/** The starter claims file's text. */
export function starterText(scan: TableScan, guess: Guess, dataFile: string, schemaRef: string, sheet?: string): string {
  const L: string[] = [];
  const dims = guess.dimensions;
  const qCol = guess.shape === 'respondents' ? { name: 'question', values: guess.questions } : (() => {
    const q = dims.find((d) => /question|item|^q$/i.test(d.name));
    return q ? { name: q.name, values: q.values } : undefined;
  })();
  const units = dims.find((d) => d !== undefined && d.name !== qCol?.name && d.distinct >= 3) ?? dims.find((d) => d.name !== qCol?.name);
  const other = dims.find((d) => d !== units && d.name !== qCol?.name);
  const unitName = units?.name ?? 'COLUMN';
  const u1 = units?.values[0] ?? 'VALUE';
  const u2 = units?.values[1] ?? 'VALUE';
  const where: Array<[string, string | string[] | { not: string }]> = [];
  if (qCol && qCol.values[0] !== undefined) where.push([qCol.name, qCol.values[0]]);
  const whereLine = where.length > 0 ? `    where: ${flow(where)}` : undefined;
  const whereWithLatest = guess.period !== undefined ? `    where: ${flow([...where, [guess.period, 'latest']])}` : whereLine;
  const measureLine = guess.shape === 'respondents' ? '    measure: mean' : guess.numeric[0] !== undefined ? `    measure: { column: ${yamlScalar(guess.numeric[0])} }` : undefined;

  L.push(`# yaml-language-server: $schema=${schemaRef}`);
  L.push('# A starter claims file. Write each claim before looking at the results, then run: warrant check <this file>');
  L.push(`title: Claims about ${yamlScalar(basename(dataFile, extname(dataFile))).replace(/^"|"$/g, '')}`);
  L.push('organisation: Your organisation');
  L.push('confidence: 95%');
  L.push('');
  L.push('sources:');
  L.push('  data:');
  L.push(`    file: ${yamlScalar(dataFile)}`);
  if (sheet !== undefined) L.push(`    sheet: ${yamlScalar(sheet)}`);
  L.push(`    shape: ${guess.shape}`);
  if (guess.shape === 'summary') {
    L.push(`    respondents: ${guess.respondents !== undefined ? yamlScalar(guess.respondents) : 'COLUMN   # the column with the number who answered: no column looked like it'}`);
    if (guess.agree !== undefined) L.push(`    agree: ${yamlScalar(guess.agree)}`);
    else if (guess.agreePercent !== undefined) L.push(`    agree_percent: ${yamlScalar(guess.agreePercent)}`);
    else L.push('    agree: COLUMN   # the column with the number who agreed: no column looked like it');
    if (guess.population !== undefined) {
      // Not switched on silently: the correction changes every interval and test that uses these rows.
      L.push(`    # population: ${yamlScalar(guess.population)}   # the number eligible; uncomment to apply the finite-population correction to every figure from these rows (tests, intervals, detectable difference)`);
    }
    if (guess.numeric.length > 0) L.push(`    numeric: [${guess.numeric.map(yamlScalar).join(', ')}]`);
    if (guess.ownMarkers.length > 0) {
      L.push(`    suppressed: [${guess.ownMarkers.map(yamlScalar).join(', ')}]   # assumed: the only texts in the count columns that are not numbers, read as cells withheld in the release`);
    }
  } else {
    L.push(`    questions: [${guess.questions.map(yamlScalar).join(', ')}]`);
    L.push('    agree_codes: [4, 5]');
    if (guess.notApplicable.length > 0) L.push(`    not_applicable: [${guess.notApplicable.join(', ')}]`);
  }
  if (guess.period !== undefined) L.push(`    period: ${yamlScalar(guess.period)}`);
  // What init detected about the table's shape, written so that a wrong guess can be corrected in one place.
  if (scan.headerRow !== 1) L.push(`    header_row: ${scan.headerRow}   # detected: the column names start on row ${scan.headerRow}${scan.headerRow > 1 ? '; the rows above hold a title or nothing' : ''}`);
  if (scan.headerRows === 2) {
    const labelled = scan.columns.filter((c) => c.label !== undefined).length;
    L.push(`    header_rows: 2   # detected: rows ${scan.headerRow} and ${scan.headerRow + 1} are both header rows (${labelled > 0 ? 'codes above their wording; the codes name the columns' : 'group headings above the column names'})`);
  }
  if (scan.tableEnd !== undefined) {
    const e = scan.tableEnd;
    L.push(`    last_row: ${e.lastRow}   # detected: the table ends at row ${e.lastRow}; the ${e.noteRows} row${e.noteRows === 1 ? '' : 's'} from row ${e.firstNoteRow} (${JSON.stringify(e.firstNote)}) ${e.noteRows === 1 ? 'is a note' : 'are notes'}`);
  }
  const withheld = scan.columns.filter((c) => Object.keys(c.markers).length > 0 && (c.name === guess.respondents || c.name === guess.agree || c.name === guess.agreePercent || c.name === guess.population));
  if (guess.shape === 'summary' && withheld.length > 0) {
    const cells = (c: ColumnScan) => Object.entries(c.markers).map(([m, k]) => `${JSON.stringify(m)} ${k}`).join(', ');
    L.push(`    # Read as suppressed (withheld in the release; never given a number): ${withheld.map((c) => `${c.name}: ${cells(c)}`).join('; ')}. A row with a marker is left out of every figure and counted in the pack.`);
  }
  L.push('');
  L.push(`# Columns found in ${dataFile}${scan.sheet !== undefined ? `, sheet "${scan.sheet}"` : ''} (${scan.rows} data rows), with their values sorted and the rows holding each:`);
  for (const c of scan.columns) {
    const role =
      c.name === guess.respondents ? 'respondents' : c.name === guess.agree ? 'agreeing' : c.name === guess.agreePercent ? 'percent agreeing' : c.name === guess.population ? 'eligible' : c.name === guess.period ? 'period' : guess.questions.includes(c.name) ? 'answers coded 1-5' : guess.numeric.includes(c.name) ? 'numeric' : undefined;
    const counts = role !== undefined && role !== 'period' && role !== 'answers coded 1-5';
    const label = c.label !== undefined ? ` ${JSON.stringify(c.label)}` : '';
    const named = `${yamlScalar(c.name)}${label}${role ? ` (${role})` : ''}`;
    if (c.more || c.distinct > LIST_LIMIT || counts || guess.questions.includes(c.name)) {
      L.push(`#   ${named}: ${c.more ? `more than ${c.distinct}` : c.distinct} distinct values`);
      continue;
    }
    L.push(`#   ${named}:`);
    const order = c.values.map((v, i) => ({ v, k: c.counts[i] ?? 0 })).sort((a, b) => a.v.localeCompare(b.v, 'en', { numeric: true }));
    for (const { v, k } of order) L.push(`#     - ${yamlScalar(v)}   # ${k} row${k === 1 ? '' : 's'}`);
  }
  L.push('');
  L.push('claims:');
  L.push('  # Remove the "# " before the lines of an example to use it, then change its words to your claim.');
  const example = (title: string, lines: Array<string | undefined>): void => {
    L.push('');
    L.push(`  # ${title}`);
    for (const line of lines) if (line !== undefined) L.push(`  # ${line.slice(2)}`);
  };
  const pair = [
    `    focus: ${flow([[unitName, u1]])}`,
    `    against: ${flow([[unitName, { not: u1 }]])}`,
  ];
  example('compare: one selection\'s agreement rate against another\'s', [
    '  - id: compare-example',
    `    claim: ${u1} agrees less than the others.`,
    '    kind: compare',
    whereWithLatest,
    ...pair,
    '    expect: lower',
  ]);
  const q1 = qCol?.values[0];
  const q2 = qCol?.values[1];
  example('association: whether two measures go together across units', [
    '  - id: association-example',
    `    claim: Where agreement on ${q1 ?? 'one question'} is higher, agreement on ${q2 ?? 'another'} is higher too.`,
    '    kind: association',
    guess.period !== undefined ? `    where: ${flow([[guess.period, 'latest']])}` : undefined,
    `    units: ${yamlScalar(unitName)}`,
    qCol && q1 !== undefined ? `    x: ${flow([[qCol.name, q1]])}` : `    x: ${flow([[other?.name ?? unitName, other?.values[0] ?? u1]])}`,
    qCol && q2 !== undefined ? `    y: ${flow([[qCol.name, q2]])}` : `    y: ${flow([[other?.name ?? unitName, other?.values[1] ?? u2]])}`,
    '    expect: positive',
  ]);
  const periodNote = guess.period === undefined ? ' (needs a period column: add period: COLUMN to the source)' : '';
  example(`change: the same selection in two periods${periodNote}`, [
    '  - id: change-example',
    `    claim: Agreement at ${u1} fell since the previous survey.`,
    '    kind: change',
    `    where: ${flow([...where, [unitName, u1]])}`,
    '    from: previous',
    '    expect: lower',
  ]);
  example(`change with focus and against: the gap between two selections in two periods${periodNote}`, [
    '  - id: gap-example',
    `    claim: The gap between ${u1} and the others narrowed since the previous survey.`,
    '    kind: change',
    whereLine,
    '    from: previous',
    `    focus: ${flow([[unitName, u1]])}`,
    '    against: rest',
    '    expect: narrowed   # the gap\'s size, whichever is ahead; or widened, or lower / higher (focus minus against)',
  ]);
  example(`trend: a rise or fall over three or more periods${periodNote}`, [
    '  - id: trend-example',
    `    claim: Agreement at ${u1} has risen over the last three surveys.`,
    '    kind: trend',
    `    where: ${flow([...where, [unitName, u1]])}`,
    '    last: 3',
    '    expect: rising',
  ]);
  example('target: a selection against a fixed value such as a target or benchmark', [
    '  - id: target-example',
    `    claim: ${u1} meets the 80% target.`,
    '    kind: target',
    whereWithLatest,
    `    select: ${flow([[unitName, u1]])}`,
    '    value: 80%',
    '    value_label: the 80% target',
    '    expect: higher',
  ]);
  example('rank: one unit the highest (or lowest) of the units where selects', [
    '  - id: rank-example',
    `    claim: ${u1} has the highest agreement of all.`,
    '    kind: rank',
    whereWithLatest,
    `    focus: ${flow([[unitName, u1]])}   # every other ${unitName} under where is a rival`,
    '    expect: highest   # or lowest',
  ]);
  example('every: each unit where selects above (or below) a fixed value', [
    '  - id: every-example',
    `    claim: Every ${unitName} is above the 70% benchmark.`,
    '    kind: every',
    whereWithLatest,
    `    units: ${yamlScalar(unitName)}`,
    '    value: 70%',
    '    value_label: the 70% benchmark',
    '    expect: higher   # or lower',
  ]);
  example('crosstab: whether agreement (or another column) differs across the values of a column', [
    '  - id: crosstab-example',
    `    claim: Agreement differs across ${unitName}.`,
    '    kind: crosstab',
    whereWithLatest,
    `    rows: ${yamlScalar(unitName)}`,
    other !== undefined && guess.shape === 'respondents' ? `    columns: ${yamlScalar(other.name)}` : '    columns: agreement',
  ]);
  example(`means: mean scores of two selections${measureLine === undefined ? ' (needs answers coded 1-5, or a numeric column listed under numeric)' : ''}`, [
    '  - id: means-example',
    `    claim: ${u1} scores lower than the others.`,
    '    kind: means',
    whereWithLatest,
    ...pair,
    measureLine ?? '    measure: { column: COLUMN }',
    '    expect: lower',
  ]);
  example('equivalence: two selections within a stated margin of each other', [
    '  - id: equivalence-example',
    `    claim: ${u1} and ${u2} agree to within 5 points.`,
    '    kind: equivalence',
    whereWithLatest,
    `    focus: ${flow([[unitName, u1]])}`,
    `    against: ${flow([[unitName, u2]])}`,
    '    margin: 5 points',
  ]);
  example('estimate: a plain figure with its margin of error', [
    '  - id: estimate-example',
    `    claim: About three in four at ${u1} agree.`,
    '    kind: estimate',
    whereWithLatest,
    `    select: ${flow([[unitName, u1]])}`,
  ]);
  return L.join('\n') + '\n';
}

/** Why a scanned sheet does not hold the table (undefined when it does). */
function notATable(scan: TableScan): string | undefined {
  if (scan.columns.length < 2) return 'no header row naming two or more columns';
  if (scan.rows === 0) return 'a header row but no rows below it';
  if (!scan.columns.some((c) => c.numbers > 0 && c.numbers >= 0.5 * c.filled)) return 'text only, no column of numbers: notes or a cover sheet';
  return undefined;
}

/**
 * The sheet of a workbook that holds the table: of the visible sheets with a header row of names and rows of numbers
 * below it, the one whose columns look like counts of respondents or answer codes, then the one with more rows (the
 * first 200 rows of each are looked at). Returns it with the sheets passed over and why.
 */
async function chooseSheet(path: string, displayPath: string): Promise<{ sheet: string; skipped: string[] }> {
  const { openXlsxSheet } = await import('../data/xlsx.js');
  const opened = await openXlsxSheet(path, { displayPath });
  const sheets = opened.sheets;
  opened.close();
  const skipped: Array<{ name: string; why: string }> = [];
  const tables: Array<{ name: string; score: number; rows: number }> = [];
  for (const s of sheets) {
    if (s.hidden) {
      skipped.push({ name: s.name, why: 'hidden' });
      continue;
    }
    let probe: TableScan;
    try {
      probe = await scanTable(path, 'xlsx', { displayPath, sheet: s.name, maxRows: 200 });
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      const problem = e.problems[0]?.problem ?? '';
      const why = /text only/.test(problem) ? 'text in single cells only, no header row of column names: notes or a cover sheet' : /no rows with any text|is empty/.test(problem) ? 'empty' : `unreadable: ${problem}`;
      skipped.push({ name: s.name, why });
      continue;
    }
    const why = notATable(probe);
    if (why !== undefined) {
      skipped.push({ name: s.name, why });
      continue;
    }
    const g = guessMeasures(probe);
    const score = g.shape === 'respondents' ? 2 : g.respondents !== undefined && (g.agree !== undefined || g.agreePercent !== undefined) ? 2 : g.respondents !== undefined ? 1 : 0;
    tables.push({ name: s.name, score, rows: probe.rows });
  }
  if (tables.length === 0) {
    throw new InputError({
      file: displayPath,
      problem: 'No sheet of the workbook holds a table of survey data (a header row of column names with rows of numbers below it)',
      found: skipped.map((k) => `"${k.name}": ${k.why}`).join('; '),
      fix: 'Name the sheet to read with --sheet, or check that this is the right workbook',
    });
  }
  const best = [...tables].sort((a, b) => b.score - a.score || b.rows - a.rows)[0]!;
  for (const t of tables) if (t !== best) skipped.push({ name: t.name, why: t.score < best.score ? 'a table, but without counts of respondents or answer codes' : 'a smaller table' });
  const order = sheets.map((s) => s.name);
  skipped.sort((a, b) => order.indexOf(a.name) - order.indexOf(b.name));
  return { sheet: best.name, skipped: skipped.map((k) => `"${k.name}" (${k.why})`) };
}

/** Write the starter claims file; returns the exit code. */
export async function init(opts: InitOptions): Promise<number> {
  const write = opts.write ?? ((t: string) => void process.stdout.write(t));
  const dataPath = resolve(opts.data);
  const format = DATA_EXTENSIONS[extname(dataPath).toLowerCase()];
  if (format === undefined) {
    throw new InputError({ file: opts.data, problem: 'warrant reads .csv and .xlsx files, and this is neither', fix: 'Save the data as .csv or .xlsx and give that file' });
  }
  if (format === 'csv' && opts.sheet !== undefined) {
    throw new InputError({ file: opts.data, field: 'sheet', found: opts.sheet, problem: 'a .csv file has no sheets', fix: 'Leave out --sheet, or give the .xlsx workbook' });
  }
  // In the current folder unless --out says otherwise: never beside the data unasked.
  const outPath = resolve(opts.out ?? 'claims.yaml');
  const outDisplay = displayPathFor(outPath);
  if (existsSync(outPath) && statSync(outPath).isDirectory()) {
    throw new InputError({ file: outDisplay, field: '--out', problem: 'this is a folder, and warrant init writes a claims file', fix: `Give --out the name of the file to write, e.g. ${join(outDisplay, 'claims.yaml')}` });
  }
  if (existsSync(outPath) && !opts.force) {
    throw new InputError({ file: outDisplay, problem: 'this file already exists, and warrant init does not overwrite it', fix: 'Choose another name with --out, or add --force to replace it' });
  }
  // The folder it goes in must be there: found before the data are read, so a typo costs nothing.
  const outFolder = dirname(outPath);
  if (!existsSync(outFolder) || !statSync(outFolder).isDirectory()) {
    throw new InputError({
      file: outDisplay,
      field: '--out',
      problem: `${existsSync(outFolder) ? `${displayPathFor(outFolder)} is a file, not a folder` : `the folder ${displayPathFor(outFolder)} does not exist`}, so the claims file cannot be written there`,
      fix: 'Give --out a file name in a folder that exists (warrant init makes no folders)',
    });
  }
  const dataDisplay = displayPathFor(dataPath);
  let sheet = opts.sheet;
  let skipped: string[] = [];
  if (format === 'xlsx' && sheet === undefined) ({ sheet, skipped } = await chooseSheet(dataPath, dataDisplay));
  const scan = await scanTable(dataPath, format, { displayPath: dataDisplay, ...(sheet !== undefined ? { sheet } : {}) });
  const guess = guessMeasures(scan);
  const outDir = dirname(outPath);
  const rel = (p: string): string => {
    const r = relative(outDir, p).split(sep).join('/');
    return r === '' ? '.' : r;
  };
  let text = starterText(scan, guess, rel(dataPath), rel(claimsSchemaPath()), format === 'xlsx' ? scan.sheet : undefined);
  if (skipped.length > 0) {
    text = text.replace(/\n    sheet: [^\n]*/, (line) => `${line}   # the sheet with the table; passed over: ${skipped.join(', ')}`);
  }
  // Written whole or not at all, never over an existing file unless --force.
  try {
    writeWhole(outPath, text, { replace: opts.force === true });
  } catch (e) {
    throw writeFailure(e, { file: outDisplay, field: '--out' }, 'writing the starter claims file', outDir, 'give --out a file name in another folder', displayPathFor) ?? e;
  }
  const said: string[] = [`${outDisplay}: written with ${scan.columns.length} columns (${guess.shape} data, ${scan.rows} rows) and an example of every kind of claim; uncomment one and run warrant check ${outDisplay}`];
  if (format === 'xlsx') said.push(`  sheet "${scan.sheet}"${skipped.length > 0 ? `; passed over ${skipped.join(', ')}` : ''}`);
  if (scan.headerRows === 2) said.push(`  the header spans rows ${scan.headerRow} and ${scan.headerRow + 1} (header_rows: 2)`);
  if (scan.tableEnd !== undefined) said.push(`  the table ends at row ${scan.tableEnd.lastRow}; ${scan.tableEnd.noteRows} row${scan.tableEnd.noteRows === 1 ? '' : 's'} below it taken as notes (last_row: ${scan.tableEnd.lastRow})`);
  const markers = scan.columns.reduce((a, c) => a + Object.values(c.markers).reduce((x, y) => x + y, 0), 0);
  if (markers > 0 && guess.shape === 'summary') said.push(`  ${markers} cell${markers === 1 ? '' : 's'} marked as withheld read as suppressed`);
  if (guess.ownMarkers.length > 0) said.push(`  assumed ${guess.ownMarkers.map((m) => JSON.stringify(m)).join(', ')} mark withheld cells (suppressed:)`);
  if (guess.population !== undefined) said.push(`  population column "${guess.population}" written as a comment: uncomment it to apply the finite-population correction`);
  write(said.join('\n') + '\n');
  return 0;
}
