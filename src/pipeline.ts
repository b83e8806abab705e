/**
 * The whole path, in order:
 *
 *   claims file ──read──▶ ClaimsFile ──data──▶ Cube per source ──analyse──▶ Analysis per claim
 *        ──adjust + decide──▶ Decision per claim ──words──▶ PackModel + results.json ──render──▶ pack.pdf
 *
 * Each stage is a plain function of the one before; `build` returns every stage's output so that tests and
 * `--json` can look at any of them. Files are written last, into a temporary folder renamed into place, so a failed
 * build never leaves a half-written pack or harms an earlier one.
 */
import { mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { basename, dirname, join, relative, resolve } from 'node:path';
import { readClaims } from './claims/read.js';
import type { ClaimsFile } from './claims/types.js';
import { readCube } from './data/cube.js';
import type { Cube } from './data/types.js';
import { analyse, columnsUsed } from './analyse/index.js';
import type { Analysis } from './analyse/types.js';
import { adjustP } from './stats/p-adjust.js';
import { decide, type Decision } from './verdicts/decide.js';
import { composeClaim } from './verdicts/compose.js';
import { ADJUST_NAMES, composePack } from './verdicts/pack.js';
import { Templates } from './verdicts/templates.js';
import { claimResult, resultsFile, type ResultsFile } from './results/results.js';
import type { PackModel } from './render/model.js';
import { packageRoot } from './paths.js';

export interface BuildOptions {
  claimsPath: string;
  /** Folder the pack is written to (replaced as a whole when the build succeeds). */
  outDir: string;
  /** Date for the cover and the PDF's metadata; defaults to the claims file's data_date. */
  date?: string;
  /** Folder of .mustache files that replace built-in wording. */
  templatesDir?: string;
  /** The command as typed, recorded in the pack. */
  command?: string;
  /** Working folder against which paths are shown (default: process.cwd()). */
  cwd?: string;
}

export interface BuildResult {
  claims: ClaimsFile;
  cubes: Cube[];
  analyses: Analysis[];
  decisions: Decision[];
  results: ResultsFile;
  model: PackModel;
  files: { pdf: string; results: string };
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
export function testClaims(claims: ClaimsFile, cubes: Cube[], claimsDisplay: string): { analyses: Analysis[]; decisions: Decision[]; tested: number } {
  const byId = new Map(cubes.map((c) => [c.sourceId, c]));
  const ctx = { minRespondents: claims.minRespondents, claimsFile: claimsDisplay };
  const analyses = claims.claims.map((claim) => {
    const cube = byId.get(claim.source);
    if (!cube) throw new Error(`internal: no data loaded for source "${claim.source}"`);
    return analyse(claim, cube, ctx);
  });
  const testedIdx = analyses.flatMap((a, i) => (a.status === 'tested' && a.test ? [i] : []));
  const adjusted = adjustP(
    testedIdx.map((i) => (analyses[i]?.test?.p as number)),
    claims.adjust,
  );
  const pAdj = new Map(testedIdx.map((i, k) => [i, adjusted[k] as number]));
  const decisions = analyses.map((a, i) => decide(a, pAdj.get(i)));
  return { analyses, decisions, tested: testedIdx.length };
}

/** Write files into a fresh temporary folder beside the target, then swap it into place. */
async function writeAtomically(outDir: string, files: Array<[string, string | Buffer]>): Promise<void> {
  const parent = dirname(outDir);
  await mkdir(parent, { recursive: true });
  const tmp = join(parent, `.${basename(outDir)}.tmp-${process.pid}`);
  await rm(tmp, { recursive: true, force: true });
  await mkdir(tmp, { recursive: true });
  try {
    for (const [name, content] of files) await writeFile(join(tmp, name), content);
    const old = join(parent, `.${basename(outDir)}.old-${process.pid}`);
    if (existsSync(outDir)) await rename(outDir, old);
    await rename(tmp, outDir);
    await rm(old, { recursive: true, force: true });
  } catch (e) {
    await rm(tmp, { recursive: true, force: true });
    throw e;
  }
}

export async function build(options: BuildOptions): Promise<BuildResult> {
  const cwd = options.cwd ?? process.cwd();
  const claimsPath = resolve(cwd, options.claimsPath);
  const claimsDisplay = displayPath(claimsPath, cwd);
  const templates = new Templates(options.templatesDir ? resolve(cwd, options.templatesDir) : undefined);
  const version = await toolVersion();

  // 1. claims
  const claims = await readClaims(claimsPath, claimsDisplay);
  // 2. data
  const cubes = await loadData(claims, cwd);
  // 3-4. statistics and verdicts
  const { analyses, decisions, tested } = testClaims(claims, cubes, claimsDisplay);
  // 5. words
  const date = options.date ?? claims.dataDate ?? 'undated';
  const ctx = {
    templates,
    claimsTested: tested,
    adjustName: ADJUST_NAMES[claims.adjust],
    adjusted: claims.adjust !== 'none' && tested > 1,
    minRespondents: claims.minRespondents,
    periodColumns: periodColumns(cubes),
  };
  const composed = analyses.map((a, i) => composeClaim(a, decisions[i] as Decision, ctx));
  const results = resultsFile({
    version,
    claims,
    claimsDisplay,
    date,
    cubes,
    results: analyses.map((a, i) => claimResult(a, decisions[i] as Decision, (composed[i] as (typeof composed)[number]).section)),
  });
  const model = composePack({
    claims,
    claimsDisplay,
    cubes,
    analyses,
    sections: composed.map((c) => c.section),
    summary: composed.map((c) => c.summary),
    claimsTested: tested,
    date,
    version,
    command: options.command ?? `warrant build ${claimsDisplay}`,
    templates,
  });
  // 6. render (loaded here, not at start-up: pdfkit and vega are slow to import)
  const { renderPdf } = await import('./render/pdf.js');
  const pdf = await renderPdf(model, { createdAt: pdfDate(date) });
  // 7. write
  const outDir = resolve(cwd, options.outDir);
  await writeAtomically(outDir, [
    ['pack.pdf', pdf],
    ['results.json', `${JSON.stringify(results, null, 2)}\n`],
  ]);
  return { claims, cubes, analyses, decisions, results, model, files: { pdf: join(outDir, 'pack.pdf'), results: join(outDir, 'results.json') } };
}

/** Columns that hold survey periods, recognised by name, so that year-on-year comparisons carry the cohort caution. */
function periodColumns(cubes: Cube[]): string[] {
  return [...new Set(cubes.flatMap((c) => c.dimensions.filter((d) => /^(year|period|wave|session|academic[ _-]?year)$/i.test(d))))];
}

/** The PDF's creation date: the data date when it is a date, else a fixed day, so that builds are repeatable. */
function pdfDate(date: string): Date {
  const parsed = /^\d{4}-\d{2}-\d{2}$/.test(date) ? new Date(`${date}T00:00:00Z`) : undefined;
  return parsed && !Number.isNaN(parsed.getTime()) ? parsed : new Date('2000-01-01T00:00:00Z');
}
