/**
 * Where things fall on the pages of the demo pack. The demo claims file is built on the 2025 release and then on the
 * 2026 release (so the second pack has its "What changed" section and verdict notices), and the 2026 PDF is read
 * back page by page with poppler's pdftotext, a tool outside the project (pages are separated by form feeds).
 *
 * Checks a committee would notice: a claim's heading, verdict and numbers share a page; a claim that fits one page
 * is on one page; a claim that runs on names itself at the top of the next page and keeps its cautions together; the
 * "What changed" section, each method note with its source, and the reproducibility table are not split.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type BuildResult } from '../../src/pipeline.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-pages-'));
let pack: BuildResult;
/**
 * Each page's text with all white space and hyphens removed, so text wrapped anywhere still matches (pdftotext drops
 * a hyphen that ends a line).
 */
let pages: string[];

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
});
