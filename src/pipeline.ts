/**
 * The whole path, in order:
 *
 *   claims file ──read──▶ ClaimsFile ──data──▶ Cube per source ──analyse──▶ Analysis per claim
 *        ──adjust + decide──▶ Decision per claim ──words──▶ PackModel + results.json ──render──▶ pack.pdf
 *
 * Each stage is a plain function of the one before; `build` returns every stage's output so that tests and
 * `--json` can look at any of them. Files are written last, as a new pack folder in the claims file's history folder
 * (src/history/store.ts), through a temporary folder renamed into place, so a failed build never leaves a
 * half-written pack or harms an earlier one. When an earlier pack exists, the new one says what changed.
 */
import { readFile } from 'node:fs/promises';
import { accessSync, constants, existsSync, lstatSync, readdirSync, readlinkSync, statSync, type Stats } from 'node:fs';
import { basename, dirname, extname, join, relative, resolve } from 'node:path';
import { readClaims } from './claims/read.js';
import type { Claim, ClaimsFile } from './claims/types.js';
import { readCube } from './data/cube.js';
import type { Cube } from './data/types.js';
import { analyse, columnsUsed } from './analyse/index.js';
import { compareAtLevel } from './analyse/compare.js';
import { periodColumnOf, resolvePeriods } from './analyse/periods.js';
import { PERIOD_NAME } from './claims/periods.js';
import type { Analysis } from './analyse/types.js';
import { adjustP } from './stats/p-adjust.js';
import { effectiveThresholds } from './stats/p-adjust-thresholds.js';
import { alphaOf, decide, type Decision } from './verdicts/decide.js';
import { composeClaims } from './verdicts/compose.js';
import { sourceLine } from './verdicts/source.js';
import { atThreshold } from './analyse/detectable.js';
import { verdictStability, type Stability } from './verdicts/stability.js';
import { decidingConfidence, headline } from './verdicts/adjusted-interval.js';
import { stabilityView } from './verdicts/words/stability.js';
import { sealStatus } from './verdicts/words/seal.js';
import { readSeal, sealPath } from './commands/seal.js';
import { ADJUST_NAMES, composePack } from './verdicts/pack.js';
import { Templates } from './verdicts/templates.js';
import { claimResult, resultsFile, type ResultsFile } from './results/results.js';
import { readingNotes } from './data/reading-notes.js';
import type { PackModel } from './render/model.js';
import { useChartThread } from './render/chart-thread.js';
import { packageRoot } from './paths.js';
import { formatProblem, InputError } from './errors.js';
import { wordsProblems } from './claims/wording.js';
import { fsFailure, otherThanFile, readOrdinaryFile, requireOrdinaryFile, writeFailure } from './files.js';
import { impossibleDate } from './claims/dates.js';
import { canonicalJson, packFingerprint, sha256Hex } from './history/fingerprint.js';
import { latestInTheWay, latestOrUnreadable, latestProblem, listPacks, openPack, outsideTemporary, packFolderName, stagePack, today, type StagedPack, type StoredPack, type WriteHooks } from './history/store.js';
import { diffPacks, type PackDiff } from './history/diff.js';
import { changeSection, editedNotice, folderDay, verdictNotice } from './history/words.js';

export interface BuildOptions {
  claimsPath: string;
  /** History folder for this claims file; each build adds a pack folder inside (default: out/<claims file name>). */
  outDir?: string;
  /** Date for the cover and the PDF's metadata; defaults to the claims file's data_date. */
  date?: string;
  /** Folder of .mustache files that replace built-in wording. */
  templatesDir?: string;
  /** The command as typed, recorded in the pack. */
  command?: string;
  /** Working folder against which paths are shown (default: process.cwd()). */
  cwd?: string;
  /** Compare with this pack (folder, its results.json, or a history folder) instead of the latest one. */
  since?: string;
  /** Replace a source's file for this build: source id -> path (relative to cwd), e.g. a corrected spreadsheet. */
  data?: Record<string, string>;
  /** Called at each stage, for progress on a terminal. */
  progress?: (message: string) => void;
  /** The clock, used only to name the pack folder (tests fix it). */
  now?: Date;
  /** Test hooks for writing (simulate an interrupted build). */
  hooks?: WriteHooks;
}

export interface BuildResult {
  claims: ClaimsFile;
  cubes: Cube[];
  analyses: Analysis[];
  decisions: Decision[];
  results: ResultsFile;
  model: PackModel;
  /** The comparison with the previous pack, if there was one. */
  diff?: PackDiff;
  /** Things the user should know that did not stop the build (an earlier pack that could not be read). */
  warnings?: string[];
  /** The pack folder and its files; `reused` when an identical pack existed already. */
  files: { folder: string; pdf: string; results: string; reused: boolean };
}

export function displayPath(path: string, cwd = process.cwd()): string {
  const rel = relative(cwd, path);
  return rel && !rel.startsWith('..') ? rel : path;
}

export async function toolVersion(): Promise<string> {
  const pkg = JSON.parse(await readFile(join(packageRoot(), 'package.json'), 'utf8')) as { version: string };
  return pkg.version;
}

/** 1. Read the claims file. 2. Read each source once into a cube holding only the columns the claims use. */
export async function loadData(claims: ClaimsFile, cwd: string): Promise<Cube[]> {
  const cubes: Cube[] = [];
  for (const source of claims.sources) {
    const users = claims.claims.filter((c) => c.source === source.id);
    if (users.length === 0) continue;
    // Keep the period column too: relative periods (latest, previous) and year-on-year cautions need it.
    const needed = [...new Set([...users.flatMap(columnsUsed), ...(source.period ? [source.period] : [])])];
    cubes.push(await readCube(source, needed, displayPath(source.path, cwd)));
  }
  return cubes;
}

/** 3-4. Test every claim, adjust the p-values of those tested for many claims, and decide each verdict. */
export function testClaims(
  claims: ClaimsFile,
  cubes: Cube[],
  claimsDisplay: string,
): { analyses: Analysis[]; decisions: Decision[]; tested: number; stability: Array<Stability | undefined> } {
  const byId = new Map(cubes.map((c) => [c.sourceId, c]));
  const periodColumns = Object.fromEntries(claims.sources.flatMap((s) => (s.period ? [[s.id, s.period]] : [])));
  // No analysis here needs its detectable difference at 1 − confidence: atThreshold below works it out at the
  // threshold that decided each verdict, and the analyses at other levels are for their verdicts only.
  const ctx = { minRespondents: claims.minRespondents, claimsFile: claimsDisplay, periodColumns, detectable: false };
  const resolved = claims.claims.map((written) => {
    const cube = byId.get(written.source);
    if (!cube) throw new Error(`internal: no data loaded for source "${written.source}"`);
    // Relative periods (latest, previous, latest-N) become the periods these data hold, so the pack names them.
    const periodColumn = periodColumnOf(cube, claims.sources.find((s) => s.id === written.source)?.period);
    return { claim: resolvePeriods(written, cube, periodColumn, claimsDisplay).claim, cube };
  });
  const analyseOne = (i: number, claim: Claim): Analysis => {
    try {
      return analyse(claim, resolved[i]!.cube, ctx);
    } catch (e) {
      throw untestable(e, claims.claims[i]!, claimsDisplay);
    }
  };
  const analyses = resolved.map(({ claim }, i) => analyseOne(i, claim));
  const testedIdx = analyses.flatMap((a, i) => (a.status === 'tested' && a.test ? [i] : []));
  const adjusted = adjustP(
    testedIdx.map((i) => (analyses[i]?.test?.p as number)),
    claims.adjust,
  );
  const pAdj = new Map(testedIdx.map((i, k) => [i, adjusted[k] as number]));
  // The threshold each claim's raw p-value was in effect held to, at its own confidence level.
  const thresholds = effectiveThresholds(
    testedIdx.map((i) => (analyses[i]?.test?.p as number)),
    testedIdx.map((i) => alphaOf(analyses[i]!.claim.confidence)),
    claims.adjust,
  );
  const threshold = new Map(testedIdx.map((i, k) => [i, thresholds[k] as number]));
  const decisions = analyses.map((a, i) => decide(a, pAdj.get(i), threshold.get(i)));
  // The smallest detectable effect at the threshold that decided each verdict, not at the unadjusted level.
  analyses.forEach((a, i) => {
    analyses[i] = atThreshold(a, threshold.get(i));
  });
  // The verdict at 90, 95 and 99% confidence, with and without the adjustment: each claim analysed again at each level.
  // A compare claim's verdict depends on the level only through alpha, so it is decided again on the same figures.
  const stability = verdictStability(claims, analyses, (i, confidence) => {
    const a = analyses[i]!;
    if (a.kind === 'compare') return compareAtLevel(a, confidence);
    const { claim } = resolved[i]!;
    return analyseOne(i, { ...claim, confidence } as typeof claim);
  });
  // Where the adjustment lowered a claim's threshold, or the claim was tested one-sided, its headline interval again at
  // the level that agrees with the test that decided it (src/verdicts/adjusted-interval.ts, decidingConfidence).
  const adjustedIntervals = analyses.map((a, i) => {
    const d = decisions[i] as Decision;
    const level = decidingConfidence(a, d.effectiveAlpha, d.alpha);
    if (level === undefined || !headline(a)) return undefined;
    const { claim, cube } = resolved[i]!;
    return headline(analyse({ ...claim, confidence: level } as typeof claim, cube, ctx));
  });
  return {
    analyses,
    decisions: decisions.map((d, i) => {
      const adjustedInterval = adjustedIntervals[i];
      const withInterval = adjustedInterval ? { ...d, adjustedInterval } : d;
      return stability[i] ? { ...withInterval, stability: stability[i] } : withInterval;
    }),
    tested: testedIdx.length,
    stability,
  };
}

/**
 * A statistical method stopped on the data a claim selects (a measure that does not vary, a table with one row, a
 * perfectly collinear control): said as a problem with that claim, with what the method reported. The methods throw
 * only on degenerate input, so this is the data's shape rather than a fault in warrant; the message says how to
 * report it should the data be as they ought to be.
 */
function untestable(e: unknown, claim: ClaimsFile['claims'][number], claimsDisplay: string): unknown {
  if (e instanceof InputError || !(e instanceof Error)) return e;
  return new InputError({
    file: claimsDisplay,
    line: claim.place.line,
    column: claim.place.column,
    field: 'id',
    found: claim.id,
    problem: `claim "${claim.id}" cannot be tested on the data it selects: the statistical method reports that ${e.message.replace(/\.$/, '').replace(/^[^:]*: /, '')}`,
    fix: 'Check the selections of this claim: a measure with the same value everywhere, or groups that all answered alike, leave nothing to test; change the claim or remove it. If the data are as they should be, please report this to the warrant maintainers with the command you ran and the output of the same command with --debug',
  });
}

/** Point sources at other files for this build (`--data id=path`), checking each exists. */
function overrideSources(claims: ClaimsFile, data: Record<string, string>, cwd: string): ClaimsFile {
  const known = claims.sources.map((x) => x.id);
  const sources = claims.sources.map((source) => {
    const given = data[source.id];
    if (given === undefined) return source;
    const path = resolve(cwd, given);
    try {
      statSync(path);
    } catch (e) {
      // A loop of links or a file where a folder should be is said as such, not as a missing file.
      if ((e as { code?: string }).code !== 'ENOENT') throw fsFailure(e, { file: given, field: `--data ${source.id}` }, 'opening the data file given on the command line') ?? e;
    }
    if (!existsSync(path)) {
      throw new InputError({ file: given, field: `--data ${source.id}`, problem: `the data file given on the command line was not found (looked for at ${path})`, fix: 'Check the path; it is read relative to the folder you run warrant in' });
    }
    if (statSync(path).isDirectory()) {
      throw new InputError({ file: given, field: `--data ${source.id}`, problem: 'the path given on the command line is a folder, not a data file', fix: 'Give the path of the .csv or .xlsx file inside the folder' });
    }
    requireOrdinaryFile(path, { file: given, field: `--data ${source.id}` }, 'data file');
    const ext = extname(path).toLowerCase();
    const format = ext === '.csv' ? 'csv' : ext === '.xlsx' ? 'xlsx' : undefined;
    if (!format) {
      throw new InputError({ file: given, field: `--data ${source.id}`, found: ext, problem: 'warrant reads .csv and .xlsx data files only', fix: 'Save the data as .xlsx or .csv' });
    }
    return { ...source, path, file: displayPath(path, cwd), format } as typeof source;
  });
  for (const id of Object.keys(data)) {
    if (!known.includes(id)) {
      throw new InputError({ file: 'command line', field: `--data ${id}`, found: id, problem: 'no source has this id in the claims file', fix: `Use one of the source ids: ${known.join(', ')}` });
    }
  }
  return { ...claims, sources };
}

/** How to write the pack somewhere else, in a fix for a folder that cannot be written. */
const OUT_ELSEWHERE = 'give --out another folder';

/** Whether `abs` is a symbolic link (whatever it leads to). */
function isLink(abs: string): boolean {
  try {
    return lstatSync(abs).isSymbolicLink();
  } catch {
    return false;
  }
}

/** The options that name folders must name folders: checked before any work, so a typo costs nothing. */
function checkFolders(options: BuildOptions, root: string, templatesDir: string | undefined): void {
  if (templatesDir !== undefined) {
    const given = options.templatesDir as string;
    if (!existsSync(templatesDir)) {
      throw new InputError({ file: given, field: '--templates', problem: `the templates folder was not found (looked for at ${templatesDir})`, fix: "Pass --templates a folder that holds .mustache files named like those in warrant's templates/ folder" });
    }
    if (!statSync(templatesDir).isDirectory()) {
      throw new InputError({ file: given, field: '--templates', problem: 'this is a file, not a folder of templates', fix: 'Pass --templates the folder that holds the .mustache files' });
    }
  }
  if (options.date !== undefined) {
    const why = options.date.trim() === '' ? 'it is empty' : impossibleDate(options.date);
    if (why !== undefined) {
      throw new InputError({ file: 'command line', field: '--date', found: options.date, problem: `the date given is not a real date: ${why}`, fix: 'Give the date shown on the pack as YYYY-MM-DD, e.g. --date 2026-03-14' });
    }
  }
  // `latest` in the history folder must be the link warrant keeps; a folder or a file there would stop the build at
  // its very end, so it is reported before any work.
  const inTheWay = latestInTheWay(root);
  if (inTheWay !== undefined) throw latestProblem(options.outDir ?? displayPath(root), inTheWay);
  // The history folder, or the nearest part of its path that exists, must be a folder that can be written in (a loop
  // of links or a read-only disk is found now, not after the pack is drawn).
  const outPlace = { file: options.outDir ?? displayPath(root), field: '--out' };
  for (let dir = root; ; dir = dirname(dir)) {
    let there: Stats;
    try {
      there = statSync(dir);
    } catch (e) {
      if ((e as { code?: string }).code === 'ENOENT' && dirname(dir) !== dir) {
        if (isLink(dir)) {
          throw new InputError({ ...outPlace, problem: `${dir} is a symbolic link to ${readlinkSync(dir)}, which does not exist, so the history folder cannot be made there`, fix: 'Make the folder the link leads to, or give --out another folder' });
        }
        continue;
      }
      throw writeFailure(e, outPlace, 'writing the pack into the history folder', dirname(dir), OUT_ELSEWHERE, displayPath) ?? e;
    }
    if (!there.isDirectory()) {
      throw new InputError({
        ...outPlace,
        problem: dir === root ? `this is ${otherThanFile(there) ?? 'a file'}, not a history folder for packs` : `${dir} is ${otherThanFile(there) ?? 'a file'}, so the history folder cannot be made inside it`,
        fix: 'Give --out a folder (new or used before for packs of this claims file)',
      });
    }
    try {
      accessSync(dir, constants.W_OK | constants.X_OK);
    } catch (e) {
      throw writeFailure(e, outPlace, 'writing the pack into the history folder', dir, OUT_ELSEWHERE, displayPath) ?? e;
    }
    return;
  }
}

/**
 * A build stopped by a problem in the data: ask the checker (src/commands/check.ts) where the claims file caused it,
 * so that a misspelt column or value is reported at its line in the claims file, with its claim. The checker's
 * report replaces the first problem only when it places some problem in the claims file; else the original stands.
 */
async function placedInClaims(e: InputError, claimsPath: string, claimsDisplay: string): Promise<InputError> {
  if (e.problems.some((p) => p.file === claimsDisplay)) return e;
  const { checkClaimsFile } = await import('./commands/check.js');
  let report;
  try {
    report = await checkClaimsFile(claimsPath, claimsDisplay);
  } catch {
    return e;
  }
  const inClaims = report.problems.filter((p) => p.file === claimsDisplay && p.line !== undefined);
  return inClaims.length > 0 ? new InputError(report.problems) : e;
}

/** Digest of a templates folder's .mustache files, so reworded packs get their own fingerprint. */
function templatesDigest(dir: string | undefined): string | null {
  if (!dir) return null;
  const names = readdirSync(dir).filter((f) => f.endsWith('.mustache')).sort();
  const read = (n: string): string => readOrdinaryFile(join(dir, n), 1024 * 1024, { file: displayPath(join(dir, n)), field: '--templates' }, 'template', (size) => new InputError({ file: displayPath(join(dir, n)), found: size, problem: 'the template is far larger than a sentence needs', fix: 'Check that this is a template; each holds one sentence or a short list' })).toString('utf8');
  return sha256Hex(names.map((n) => `${n}\n${read(n)}`).join('\n'));
}

/** Claims edited since an earlier pack showed their results: id -> the day of the latest such pack. */
function editedSince(history: StoredPack[], results: ResultsFile, exclude: string): Map<string, string> {
  const edited = new Map<string, string>();
  for (const pack of history) {
    if (pack.name === exclude) continue;
    for (const old of pack.results.claims) {
      const now = results.claims.find((c) => c.id === old.id);
      if (now && old.fingerprint && now.fingerprint !== old.fingerprint) edited.set(old.id, folderDay(pack.name) ?? pack.results.date);
    }
  }
  return edited;
}

export async function build(options: BuildOptions): Promise<BuildResult> {
  // Charts are drawn on a second thread, which loads the charting libraries while the claims and data are read; it
  // stops when the build ends, whichever way (render/chart-thread.ts).
  const chartsDrawn = useChartThread();
  try {
    return await buildPack(options, chartsDrawn);
  } finally {
    chartsDrawn();
  }
}

async function buildPack(options: BuildOptions, chartsDrawn: () => void): Promise<BuildResult> {
  const cwd = options.cwd ?? process.cwd();
  const say = options.progress ?? (() => {});
  const claimsPath = resolve(cwd, options.claimsPath);
  const claimsDisplay = displayPath(claimsPath, cwd);
  const templatesDir = options.templatesDir ? resolve(cwd, options.templatesDir) : undefined;
  const root = resolve(cwd, options.outDir ?? join('out', basename(claimsPath, extname(claimsPath))));
  checkFolders(options, root, templatesDir);
  const templates = new Templates(templatesDir);
  const version = await toolVersion();

  // 1. claims
  // An earlier pack named with --since must exist: checked before any work is done.
  const since = options.since !== undefined ? openPack(resolve(cwd, options.since), options.since) : undefined;
  if (options.since !== undefined && !since) {
    throw new InputError({ file: options.since, field: '--since', problem: 'no pack was found there (a pack folder holds results.json)', fix: 'give a pack folder, its results.json, or a history folder with a latest pack' });
  }
  say('Reading the claims file');
  let claims = await readClaims(claimsPath, claimsDisplay);
  // The seal beside the claims file, if any (warrant seal): read now, so a damaged seal stops the build before any work.
  const sealDisplay = displayPath(sealPath(claimsPath), cwd);
  const seal = readSeal(claimsPath, sealDisplay);
  if (options.data) claims = overrideSources(claims, options.data, cwd);
  // 2. data
  say('Reading the data');
  // A selection the data cannot meet (a misspelt column or value) is the claims file's fault: say where in it. Only a
  // claims file read as written can be checked again, not one whose sources --data points elsewhere.
  const selecting = new Set(claims.claims.flatMap(columnsUsed));
  const relocate = async (e: unknown, always: boolean): Promise<unknown> =>
    e instanceof InputError && !options.data && (always || e.problems.some((p) => p.field !== undefined && selecting.has(p.field)))
      ? placedInClaims(e, claimsPath, claimsDisplay)
      : e;
  let cubes: Cube[];
  try {
    cubes = await loadData(claims, cwd);
  } catch (e) {
    throw await relocate(e, false);
  }
  // 3-4. statistics and verdicts
  say(`Testing ${claims.claims.length} claims`);
  let tested: ReturnType<typeof testClaims>;
  try {
    tested = testClaims(claims, cubes, claimsDisplay);
  } catch (e) {
    throw await relocate(e, true);
  }
  const { analyses, decisions } = tested;
  const claimsTested = tested.tested;
  // 5. words
  const date = options.date ?? claims.dataDate ?? 'undated';
  const fingerprint = packFingerprint({
    claims: claims.sha256,
    data: cubes.map((c) => `${c.sourceId}:${c.sha256}`),
    version,
    options: { date, templates: templatesDigest(templatesDir), ...(seal ? { seal: sha256Hex(canonicalJson(seal)) } : {}) },
  });
  const wordsData = (c: Claim): { values: Cube['values']; period?: string } | undefined => {
    const cube = cubes.find((x) => x.sourceId === c.source);
    const period = claims.sources.find((x) => x.id === c.source)?.period;
    return cube !== undefined ? { values: cube.values, ...(period !== undefined ? { period } : {}) } : undefined;
  };
  const ctx = {
    templates,
    claimsTested,
    // Each claim's method line names the adjustment made: none when only one claim was tested, whatever the file asks.
    adjustName: ADJUST_NAMES[claims.adjust !== 'none' && claimsTested > 1 ? claims.adjust : 'none'],
    adjusted: claims.adjust !== 'none' && claimsTested > 1,
    minRespondents: claims.minRespondents,
    periodColumns: periodColumns(claims, cubes),
    wordsData,
  };
  const sourceLines = analyses.map((a) => sourceLine(a, claims.sources.find((s) => s.id === a.claim.source), cubes.find((c) => c.sourceId === a.claim.source), templates));
  const composed = composeClaims(analyses, decisions, ctx, sourceLines).map((c, i) => {
    const decision = decisions[i] as Decision;
    if (!decision.stability) return c;
    const stability = stabilityView(decision.stability, (analyses[i] as Analysis).claim.confidence, claimsTested, templates);
    return { ...c, section: { ...c.section, stability }, summary: { ...c.summary, dependsOnLevel: stability.dependsOnLevel } };
  });
  const sealed = sealStatus(claims, claims.claims, seal, sealDisplay, templates);
  const results = resultsFile({
    version,
    fingerprint,
    claims,
    claimsDisplay,
    date,
    cubes,
    seal: sealed.facts,
    claimsTested,
    readingNotes: Object.fromEntries(cubes.map((c) => [c.sourceId, readingNotes(c, templates)])),
    results: analyses.map((a, i) => claimResult(a, decisions[i] as Decision, (composed[i] as (typeof composed)[number]).section, claims.claims[i], composed[i]?.worth)),
  });

  // 6. history: what changed since the previous pack, and claims edited after their results were seen
  const name = packFolderName(today(options.now), fingerprint);
  const latest = since === undefined ? latestOrUnreadable(root) : undefined;
  const unreadable = latest !== undefined && 'reason' in latest ? latest : undefined;
  const previous = since ?? (latest !== undefined && 'results' in latest ? latest : undefined);
  const diff = previous && previous.name !== name ? diffPacks(previous.results, results, { before: previous.name, after: name }) : undefined;
  const edited = editedSince(listPacks(root), results, name);
  const sections = composed.map((c) => {
    const notices: string[] = [];
    const afterSeal = sealed.notices.get(c.section.id);
    if (afterSeal !== undefined) notices.push(afterSeal);
    const day = edited.get(c.section.id);
    if (day !== undefined) notices.push(editedNotice(day, templates));
    const change = diff?.verdicts.find((v) => v.id === c.section.id);
    if (change && diff) notices.push(verdictNotice(diff, change, templates));
    return notices.length > 0 ? { ...c.section, notices } : c.section;
  });
  const model = composePack({
    claims,
    claimsDisplay,
    cubes,
    analyses,
    sections,
    summary: composed.map((c) => c.summary),
    claimsTested,
    date,
    version,
    command: options.command ?? `warrant build ${claimsDisplay}`,
    templates,
    sealText: sealed.text,
    periodColumns: ctx.periodColumns,
  });
  if (diff) model.changes = changeSection(diff, templates);
  if (unreadable) {
    // Said in the pack and on the terminal, rather than leaving out "What changed" without a word.
    const view = { folder: unreadable.name, reason: unreadable.reason };
    model.changes = { heading: templates.render('history.unreadable-heading', view), intro: templates.render('history.unreadable', view), verdicts: [], notes: [] };
  }

  // 7. render (loaded here, not at start-up: pdfkit and vega are slow to import). The chart thread starts on the
  // charts now, while pdfkit loads and the pages before the claims are laid out.
  const { prefetchCharts } = await import('./render/charts.js');
  prefetchCharts(model.claims.flatMap((c) => (c.chart ? [c.chart.data] : [])));
  say(`Drawing the pack (${analyses.length} claims)`);
  // results.xlsx and the text of results.json come from the results alone: made while the chart thread draws, as the
  // pages would otherwise wait for the charts.
  const { writeResultsXlsx } = await import('./results/xlsx.js');
  const xlsx = await writeResultsXlsx(results);
  const { renderPdfParts } = await import('./render/pdf.js');
  const { chartFileNames, chartFilesOf } = await import('./results/charts-out.js');
  // 8. write: into a temporary folder opened now, each chart's files as soon as its page has used it (held until
  // the end, two copies of every chart's SVG grew with the number of claims), the PDF last, then renamed into place.
  const names = ['results.json', 'results.xlsx', ...chartFileNames(model), 'pack.pdf'];
  const outPlace = { file: options.outDir ?? displayPath(root), field: '--out' };
  // A full disk, a read-only folder, a name too long: the user's to fix, and no half-written pack is left.
  const writeProblem = (e: unknown): unknown =>
    writeFailure(e, outPlace, 'writing the pack into the history folder', root, OUT_ELSEWHERE, (abs) => displayPath(outsideTemporary(abs, root))) ?? e;
  let staged: StagedPack;
  try {
    staged = await stagePack(root, name, names, options.hooks ?? {});
  } catch (e) {
    throw writeProblem(e);
  }
  let stored: { path: string; reused: boolean };
  try {
    const put = (rel: string, content: string | Buffer | Buffer[]): void => {
      try {
        staged.write(rel, content);
      } catch (e) {
        throw writeProblem(e);
      }
    };
    // The text of results.json (two bytes a character once a name holds a letter beyond Latin-1: 18 MB for 2,000
    // claims) is made here and written at once, never held in a variable of this function while the pages are drawn.
    put('results.json', `${JSON.stringify(results, null, 2)}\n`);
    put('results.xlsx', xlsx);
    const pdf = await renderPdfParts(model, {
      createdAt: pdfDate(date),
      chartsDrawn,
      chartDrawn: (claim, svg) => {
        if (!staged.reused) for (const [rel, content] of chartFilesOf(claim, svg)) put(rel, content);
      },
    });
    say('Writing the pack');
    put('pack.pdf', pdf);
    try {
      stored = await staged.finish();
    } catch (e) {
      throw writeProblem(e);
    }
  } catch (e) {
    await staged.abandon();
    throw e;
  }
  // Said on the terminal even with --quiet: a claim whose words and fields disagree (its page carries a caution too),
  // and an earlier pack that could not be read.
  const warnings = [
    ...wordsProblems(claims, claimsDisplay, wordsData).map((p) => `warning: ${formatProblem(p)}`),
    ...(unreadable ? [`The latest earlier pack, ${unreadable.name}, could not be read (${unreadable.reason}), so the pack cannot say what changed since it; it says so in place of "What changed".`] : []),
  ];
  return {
    claims,
    cubes,
    analyses,
    decisions,
    results,
    model,
    ...(diff ? { diff } : {}),
    ...(warnings.length > 0 ? { warnings } : {}),
    files: { folder: stored.path, pdf: join(stored.path, 'pack.pdf'), results: join(stored.path, 'results.json'), reused: stored.reused },
  };
}

/**
 * Columns that hold survey periods, so that comparisons between periods carry the caution that different people
 * answered: each source's declared `period` column, or a column named like one (Year, Period, Wave...).
 */
function periodColumns(claims: ClaimsFile, cubes: Cube[]): string[] {
  const declared = claims.sources.flatMap((s) => (s.period ? [s.period] : []));
  const named = cubes.flatMap((c) => c.dimensions.filter((d) => PERIOD_NAME.test(d)));
  return [...new Set([...declared, ...named])];
}

/** The PDF's creation date: the data date when it is a date, else a fixed day, so that builds are repeatable. */
function pdfDate(date: string): Date {
  const parsed = /^\d{4}-\d{2}-\d{2}$/.test(date) ? new Date(`${date}T00:00:00Z`) : undefined;
  return parsed && !Number.isNaN(parsed.getTime()) ? parsed : new Date('2000-01-01T00:00:00Z');
}
