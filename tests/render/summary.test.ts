/**
 * The summary page, through the command line: `node bin/warrant.js build demo/claims.yaml` in a fresh folder, the
 * PDF read back with poppler (pdftotext for the words, pdfinfo -struct-text for the rows of the summary table), tools
 * outside the project, and compared with results.json from the same run and the verdict definitions template.
 *
 * What a lay committee member must find on it: every verdict word the pack uses, with its meaning and count; the
 * claims that must not be made first; on each row the verdict's word, what to do with the claim, the level of the
 * key figure's interval, and a mark where the verdict depends on the confidence level chosen.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import Mustache from 'mustache';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-summary-'));

interface ResultClaim {
  id: string;
  kind: string;
  verdict: string;
  verdictLabel: string;
  confidence: number;
  advice: { action: string; label: string };
  stability?: { dependsOnLevel: boolean };
}
let claims: ResultClaim[];
/** The summary section's text (pdftotext, white space folded): from its heading to the first claim's label. */
let summaryText: string;
/** The summary table's rows: the strings of each row's cells, from the structure tree. */
let rows: string[][];
/** The rows of the table of verdict words, the same way. */
let definitionRows: string[][];

const fold = (s: string): string => s.replace(/\s+/g, ' ').trim();
/** The order the summary promises: what must not be said first, then what to reword, drop and quote. */
const ACTIONS = ['must-not-make', 'reword', 'drop', 'quote', 'quote-with-interval'];

beforeAll(() => {
  execFileSync(process.execPath, [join(root, 'bin/warrant.js'), 'build', join(root, 'demo/claims.yaml'), '--out', join(work, 'out')], {
    cwd: root,
    encoding: 'utf8',
  });
  const folder = join(work, 'out', readdirSync(join(work, 'out')).find((f) => f !== 'latest')!);
  claims = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')).claims;
  const pdf = join(folder, 'pack.pdf');
  const text = fold(execFileSync('pdftotext', ['-enc', 'UTF-8', pdf, '-'], { encoding: 'utf8' }));
  summaryText = text.slice(text.indexOf('Summary'), text.indexOf('CLAIM '));
  const tree = execFileSync('pdfinfo', ['-struct-text', pdf], { encoding: 'utf8' });
  /** Rows of the table that follows heading `from`, each as the strings of its cells (heading and header row dropped). */
  const tableRows = (from: string, to: string): string[][] =>
    tree
      .slice(tree.indexOf(`"${from}"`), tree.indexOf(`"${to}"`))
      .split(/\n\s+TR\n/)
      .slice(2)
      .map((chunk) => [...chunk.matchAll(/^\s+"(.*)"$/gm)].map((m) => m[1]!));
  rows = tableRows('The claims, and what to do with each', 'What the advice means');
  definitionRows = tableRows('What the verdicts mean', 'The claims, and what to do with each');
}, 180_000);

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('summary page (demo pack, built with the CLI)', () => {
  it('defines every verdict word the pack uses, with the count of claims that got it', () => {
    // The demo sets no worth_reporting: the definitions name the defaults for the measures its claims use; it adjusts
    // for many claims (Holm), so "Supported" says so.
    const worthSizes = '5 points for rates, 0.2 standard deviations for mean scores and a correlation of 0.3 across units';
    const definitions = Mustache.render(readFileSync(join(root, 'templates/verdict-definitions.mustache'), 'utf8'), { worthSizes, adjusted: true })
      .trim()
      .split('\n')
      .map((line) => line.split(' | '));
    const used = [...new Set(claims.map((c) => c.verdictLabel))];
    expect(used.length).toBeGreaterThanOrEqual(6);
    for (const label of used) {
      const text = definitions.find(([l]) => l === label)?.[1];
      expect(text, label).toBeDefined();
      const n = claims.filter((c) => c.verdictLabel === label).length;
      const word = label.split(': ')[0]!;
      const detail = label.split(': ')[1];
      // One row: the badge's word with its refinement under it, the count, then the meaning (as a sentence).
      const meaning = text![0]!.toUpperCase() + text!.slice(1);
      expect(definitionRows, label).toContainEqual([word, ...(detail ? [detail] : []), `${n} ${n === 1 ? 'claim' : 'claims'}`, meaning]);
    }
  });

  it('lists the claims that must not be made first, then those to reword, drop and quote', () => {
    const ids = rows.map((cells) => cells.find((s) => claims.some((c) => c.id === s))!);
    expect(ids).toHaveLength(claims.length);
    const actions = ids.map((id) => claims.find((c) => c.id === id)!.advice.action);
    const mustNot = claims.filter((c) => c.advice.action === 'must-not-make').map((c) => c.id);
    expect(mustNot.length).toBe(2);
    expect(ids.slice(0, mustNot.length).sort()).toEqual(mustNot.sort());
    const ranks = actions.map((a) => ACTIONS.indexOf(a));
    expect(ranks.every((r) => r >= 0)).toBe(true);
    expect(ranks).toEqual([...ranks].sort((a, b) => a - b));
  });

  it("gives each row the verdict's word, what to do with the claim and its interval's level", () => {
    for (const cells of rows) {
      const claim = claims.find((c) => cells.includes(c.id))!;
      expect(cells, claim.id).toContain(claim.verdictLabel.split(': ')[0]);
      expect(cells, claim.id).toContain(claim.advice.label);
      if (claim.verdict === 'too-little-data' || claim.id === 'feedback-trend' || claim.kind === 'crosstab') continue;
      // The equivalence claim's key figure is its 1 - 2 alpha interval (TOST; Schuirmann 1987): 90% at 95%.
      const level = claim.id === 'campuses-equally-reachable' ? 90 : Math.round(claim.confidence * 100);
      expect(cells, claim.id).toContain(`${level}% interval`);
    }
  });

  it('marks the claims whose verdict depends on the confidence level chosen, and only those', () => {
    const marked = rows.filter((cells) => cells.some((s) => s.startsWith('Depends on the confidence level chosen')));
    const expected = claims.filter((c) => c.stability?.dependsOnLevel).map((c) => c.id);
    expect(expected.length).toBeGreaterThanOrEqual(1);
    expect(marked.map((cells) => claims.find((c) => cells.includes(c.id))!.id).sort()).toEqual(expected.sort());
  });

  it('says what each piece of advice means', () => {
    for (const label of new Set(claims.map((c) => c.advice.label))) expect(summaryText).toContain(`${label} `);
    expect(summaryText).toContain('What the advice means');
  });
});
