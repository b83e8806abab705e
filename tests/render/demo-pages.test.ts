/**
 * Where things fall on the pages of the demo pack. The demo claims file is built on the 2025 release and then on the
 * 2026 release (so the second pack has its "What changed" section and verdict notices), and the 2026 PDF is read
 * back page by page with poppler's pdftotext, a tool outside the project (pages are separated by form feeds).
 *
 * Checks a committee would notice: a claim's heading, verdict and numbers share a page; a claim that fits one page
 * is on one page; a claim that runs on names itself at the top of the next page and keeps its cautions together; no
 * page of claims is left mostly empty (measured from pdftotext -bbox word boxes); each claim's page names its source
 * and response rate, says what to do with the claim, and shows its verdict at 90, 95 and 99% as results.json has it;
 * four-column labels stay on one line and method lines are 9 pt; the "What changed" section, each method note with
 * its source, and the reproducibility table are not split.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type BuildResult } from '../../src/pipeline.js';
import { MARGIN, PAGE } from '../../src/render/pdf/style.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-pages-'));
let pack: BuildResult;
/**
 * Each page's text with all white space and hyphens removed, so text wrapped anywhere still matches (pdftotext drops
 * a hyphen that ends a line).
 */
let pages: string[];
/** Each page's words with their boxes (pdftotext -bbox), in reading order. */
let boxes: Array<Array<{ text: string; yMin: number; yMax: number }>>;
/** The pack's results.json as written (not the model the renderer drew from). */
let results: {
  settings: { claimsTested: number };
  sources: Array<{ id: string; file: string }>;
  claims: Array<{
    id: string;
    source: string;
    verdict: string;
    confidence: number;
    p?: number | null;
    pAdjusted?: number | null;
    verdictDetail?: string;
    responseRate?: number | null;
    advice: { action: string; label: string; reason: string; wording?: string };
    stability?: { adjustmentApplies: boolean; levels: Array<{ level: number; adjusted: string; unadjusted: string }> };
  }>;
};

/** Indexes of the pages a claim's section covers: the page it opens on and any page it continues on. */
function claimPages(id: string): number[] {
  return [headingPage(id), ...pages.flatMap((p, i) => (p.includes(continuedLabel(id)) ? [i] : []))];
}

/** The words of a page from poppler's bounding-box output. */
function pageWords(page: string): Array<{ text: string; yMin: number; yMax: number }> {
  const words = [...page.matchAll(/<word xMin="[\d.]+" yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)">([^<]*)<\/word>/g)];
  const unescape = (t: string): string => t.replace(/&amp;/g, '&').replace(/&lt;/g, '<').replace(/&gt;/g, '>').replace(/&quot;/g, '"').replace(/&#39;|&apos;/g, "'");
  return words.map((m) => ({ text: unescape(m[3]!), yMin: Number(m[1]), yMax: Number(m[2]) }));
}

/** The verdict words of the pack (the words its summary page defines), by verdict. */
const VERDICT_WORD: Record<string, string> = { supported: 'Supported', 'not-supported': 'Not supported', opposite: 'Points the other way' };

function squeeze(s: string): string {
  return s.replace(/[\s-]+/g, '');
}

/** Indexes of the pages holding this text. */
function pagesWith(text: string): number[] {
  const t = squeeze(text);
  return pages.flatMap((p, i) => (p.includes(t) ? [i] : []));
}

/** The line that opens a page on which a claim continues. */
function continuedLabel(id: string): string {
  return squeeze(`CLAIM ${id} (CONTINUED)`.toUpperCase());
}

/** The page that opens a claim's section: it has the claim's label and is not a continuation page. */
function headingPage(id: string): number {
  const label = squeeze(`CLAIM ${id}`.toUpperCase());
  const found = pages.flatMap((p, i) => (p.includes(label) && !p.includes(continuedLabel(id)) ? [i] : []));
  expect(found, `pages opening claim ${id}`).toHaveLength(1);
  return found[0]!;
}

beforeAll(async () => {
  const outDir = join(work, 'history');
  await build({
    claimsPath: 'demo/claims.yaml',
    outDir,
    cwd: root,
    data: { lanternfield: 'demo/data/2025/summary.xlsx', pulse: 'demo/data/2025/respondents.csv' },
    now: new Date(Date.UTC(2025, 2, 10)),
  });
  pack = await build({ claimsPath: 'demo/claims.yaml', outDir, cwd: root, now: new Date(Date.UTC(2026, 2, 10)) });
  const text = execFileSync('pdftotext', ['-enc', 'UTF-8', pack.files.pdf, '-'], { encoding: 'utf8' });
  // pdftotext ends every page with a form feed.
  pages = text.split('\f').slice(0, -1).map(squeeze);
  const bbox = execFileSync('pdftotext', ['-enc', 'UTF-8', '-bbox', pack.files.pdf, '-'], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
  boxes = bbox.split('<page ').slice(1).map(pageWords);
  results = JSON.parse(readFileSync(pack.files.results, 'utf8'));
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('demo pack pages (2026 release after a 2025 pack)', () => {
  it('has one page of text per page reported by pdfinfo, and a "What changed" section', () => {
    const info = execFileSync('pdfinfo', [pack.files.pdf], { encoding: 'utf8' });
    expect(pages.length).toBe(Number(/Pages:\s+(\d+)/.exec(info)?.[1]));
    expect(pack.model.changes?.verdicts.length).toBeGreaterThan(0);
  });

  it("puts each claim's heading, verdict word, verdict paragraph and every number on one page", () => {
    for (const claim of pack.model.claims) {
      const page = pages[headingPage(claim.id)]!;
      expect(page, claim.id).toContain(squeeze(claim.statement));
      expect(page, claim.id).toContain(squeeze(claim.verdictLabel));
      expect(page, claim.id).toContain(squeeze(claim.verdictText));
      for (const row of claim.numbers) expect(page, `${claim.id}: ${row.label}`).toContain(squeeze(row.value));
      expect(page, claim.id).toContain(squeeze(claim.methodLine));
    }
  });

  it('keeps every claim without a scatter or period chart to two pages at most, its cautions on one of them', () => {
    // A claim's page now also carries its advice, source, linked claims and verdict at other levels, so a claim with
    // a notice may run onto a second page; it never takes a third, and its cautions are never split.
    const short = pack.model.claims.filter((c) => c.chart?.data.kind !== 'scatter' && c.chart?.data.kind !== 'periods');
    expect(short.length).toBeGreaterThanOrEqual(10);
    for (const claim of short) {
      const first = headingPage(claim.id);
      const next = pagesWith(continuedLabel(claim.id));
      expect(next.length, claim.id).toBeLessThanOrEqual(1);
      const pagesOfClaim = [first, ...next];
      for (const caution of claim.cautions) {
        expect(pagesWith(caution).some((i) => pagesOfClaim.includes(i)), `${claim.id}: ${caution}`).toBe(true);
      }
    }
  });

  it('starts the next page of a claim that runs on with its name, and keeps its cautions with their heading', () => {
    for (const claim of pack.model.claims) {
      const first = headingPage(claim.id);
      const continued = pages.flatMap((p, i) => (p.includes(continuedLabel(claim.id)) ? [i] : []));
      expect(continued.length, claim.id).toBeLessThanOrEqual(1);
      if (continued.length === 0 || claim.cautions.length === 0) continue;
      expect(continued[0]).toBe(first + 1);
      // The cautions and their heading all sit on one page: no caution is left alone at a page's top or bottom.
      const where = new Set(claim.cautions.map((c) => pagesWith(c).find((i) => i === first || i === first + 1)));
      expect(where.size, claim.id).toBe(1);
      expect(pages[[...where][0]!]).toContain('Cautions');
    }
  });

  it('keeps the "What changed" section on one page', () => {
    const changes = pack.model.changes!;
    const at = pagesWith(changes.heading).filter((i) => i > 0);
    expect(at).toHaveLength(1);
    const page = pages[at[0]!]!;
    // Table cells on one line are read across the row, so look for each changed claim's id (the end of its cell).
    for (const v of changes.verdicts) expect(page, v.claim).toContain(squeeze(/\([^()]+\)$/.exec(v.claim)?.[0] ?? v.claim));
    for (const note of changes.notes) expect(page, note).toContain(squeeze(note));
  });

  it('prints each method note on the same page as its source line', () => {
    for (const m of pack.model.methods) {
      const together = pages.some((p) => p.includes(squeeze(m.text)) && p.includes(squeeze(`Source: ${m.source}`)));
      expect(together, m.name).toBe(true);
    }
  });

  it('does not split the reproducibility table', () => {
    const last = pages.at(-1)!;
    expect(last).toContain('Reproducibility');
    for (const r of pack.model.reproducibility) expect(last, r.label).toContain(squeeze(r.value));
  });

  it('fills every page of the claims: no page holds only a chart or a caution or two', () => {
    // How far down its text reaches, as a share of the room between the margins (the running header and the page
    // footer sit outside them). Every page from the first claim to the last but one is at least 40% full; a page
    // that ends one claim and has no room for the next whole claim is the only kind that may be short.
    const first = headingPage(results.claims[0]!.id);
    const last = Math.max(...results.claims.flatMap((c) => claimPages(c.id)));
    expect(last).toBeGreaterThan(first + results.claims.length / 2);
    const room = PAGE.height - MARGIN.bottom - MARGIN.top;
    const fill = boxes.map((words) => {
      const body = words.filter((w) => w.yMin > MARGIN.top - 4 && w.yMax < PAGE.height - MARGIN.bottom + 2);
      return (Math.max(MARGIN.top, ...body.map((w) => w.yMax)) - MARGIN.top) / room;
    });
    const short = fill.slice(first, last).flatMap((f, i) => (f < 0.4 ? [`page ${first + i + 1}: ${Math.round(f * 100)}%`] : []));
    expect(short).toEqual([]);
    // Continuation pages carry a good share of their claim, not a lone chart or caution.
    const continued = results.claims.flatMap((c) => claimPages(c.id).slice(1));
    for (const i of continued) expect(fill[i], `page ${i + 1}`).toBeGreaterThan(0.4);
    // Many claims fit on one page (all but the densest); a claim runs over two pages at most.
    const single = results.claims.filter((c) => claimPages(c.id).length === 1);
    expect(single.length).toBeGreaterThanOrEqual(results.claims.length / 3);
    for (const c of results.claims) expect(claimPages(c.id).length, c.id).toBeLessThanOrEqual(2);
  });

  it("names each claim's source and its response rate (or that it is unknown) on the claim's pages", () => {
    for (const claim of results.claims) {
      const text = claimPages(claim.id).map((i) => pages[i]).join('');
      const source = results.sources.find((s) => s.id === claim.source)!;
      expect(text, claim.id).toContain(squeeze(`Source:`));
      expect(text, claim.id).toContain(squeeze(`(${source.file})`));
      if (typeof claim.responseRate === 'number') {
        expect(text, claim.id).toContain(squeeze(`Response rate: ${Math.round(claim.responseRate * 100)}% of those eligible answered`));
      } else {
        // Unknown (no number eligible), not shown (a withheld result) or not computed (a claim across units).
        expect(text, claim.id).toMatch(/Responserate:(unknown|notshown|notcomputed)/);
      }
    }
    // Both kinds of line occur in the demo.
    expect(results.claims.some((c) => typeof c.responseRate === 'number')).toBe(true);
    expect(results.claims.some((c) => typeof c.responseRate !== 'number')).toBe(true);
  });

  it("prints what to do with each claim under its verdict, on the claim's first page", () => {
    for (const claim of results.claims) {
      const page = pages[headingPage(claim.id)]!;
      const { action, label, reason, wording } = claim.advice;
      expect(page, claim.id).toContain(squeeze(`What to do ${label}.`));
      if (action !== 'quote' && action !== 'quote-with-interval') expect(page, claim.id).toContain(squeeze(reason));
      if (wording && action !== 'quote-with-interval') expect(page, claim.id).toContain(squeeze(`Suggested wording ${wording}`));
      // The advice follows the verdict paragraph and comes before what was compared.
      const at = page.indexOf(squeeze(`What to do ${label}.`));
      expect(at, claim.id).toBeGreaterThan(page.indexOf(squeeze(pack.model.claims.find((c) => c.id === claim.id)!.verdictText)));
    }
    expect(new Set(results.claims.map((c) => c.advice.action)).size).toBeGreaterThanOrEqual(4);
  });

  it("shows the verdict at 90, 95 and 99% with and without adjustment as results.json has it, agreeing with the p-values", () => {
    const n = results.settings.claimsTested;
    let grids = 0;
    for (const claim of results.claims) {
      const s = claim.stability;
      if (!s) {
        expect(['too-little-data', 'estimate'], claim.id).toContain(claim.verdict);
        continue;
      }
      expect(s.levels.map((l) => l.level)).toEqual([0.9, 0.95, 0.99]);
      // The verdict the pack gives is the one at the claim's own level, with the adjustment.
      expect(s.levels.find((l) => l.level === claim.confidence)!.adjusted, claim.id).toBe(claim.verdict);
      // A test at level L finds a difference when its p-value is below 1 - L (common practice); the adjusted
      // verdicts follow the adjusted p-value and the unadjusted ones the claim's own p-value.
      if (claim.verdictDetail !== 'too-small') {
        for (const l of s.levels) {
          const alpha = Math.round((1 - l.level) * 1000) / 1000;
          expect(l.adjusted === 'not-supported', `${claim.id} at ${l.level}`).toBe(claim.pAdjusted! >= alpha);
          expect(l.unadjusted === 'not-supported', `${claim.id} at ${l.level} unadjusted`).toBe(claim.p! >= alpha);
        }
      }
      const page = pages[headingPage(claim.id)]!;
      const same = s.levels.every((l) => l.adjusted === s.levels[0]!.adjusted && l.unadjusted === s.levels[0]!.adjusted);
      if (same) {
        const word = VERDICT_WORD[s.levels[0]!.adjusted]!;
        expect(page, claim.id).toContain(squeeze(`${word} at 90%, 95% and 99% confidence${s.adjustmentApplies ? `, with or without the adjustment for ${n} claims` : ''}.`));
      } else {
        grids++;
        expect(page, claim.id).toContain(squeeze('Verdict at each confidence level 90% 95% 99%'));
        expect(page, claim.id).toContain(squeeze(`Adjusted for ${n} claims ${s.levels.map((l) => VERDICT_WORD[l.adjusted]).join(' ')}`));
        if (s.adjustmentApplies) expect(page, claim.id).toContain(squeeze(`Not adjusted ${s.levels.map((l) => VERDICT_WORD[l.unadjusted]).join(' ')}`));
      }
    }
    // The demo has claims whose verdict depends on the level or on the adjustment, drawn as a grid.
    expect(grids).toBeGreaterThanOrEqual(1);
  });

  it('keeps four-column labels on one line and prints method lines at 9 pt', () => {
    const n = results.settings.claimsTested;
    const label = ['p-value', 'adjusted', 'for', String(n), 'claims'];
    let seen = 0;
    for (const claim of results.claims) {
      const words = boxes[headingPage(claim.id)]!;
      const i = words.findIndex((w, k) => label.every((t, j) => words[k + j]?.text === t));
      if (i < 0) continue;
      seen++;
      // All five words on one line: the same top.
      for (let j = 1; j < label.length; j++) expect(words[i + j]!.yMin, claim.id).toBeCloseTo(words[i]!.yMin, 1);
      // The method line: its words are set at 9 pt (poppler's box for Noto Sans is 1.362 em tall).
      const method = pack.model.claims.find((c) => c.id === claim.id)!.methodLine.split(' ');
      const m = words.findIndex((w, k) => method.slice(0, 4).every((t, j) => words[k + j]?.text === t));
      expect(m, claim.id).toBeGreaterThanOrEqual(0);
      expect((words[m]!.yMax - words[m]!.yMin) / 1.362, claim.id).toBeGreaterThanOrEqual(8.95);
    }
    expect(seen).toBeGreaterThanOrEqual(10);
  });
});
