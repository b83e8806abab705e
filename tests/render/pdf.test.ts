/**
 * Renderer tests: the sample model is rendered and the PDF is checked with poppler-utils (pdfinfo, pdftotext) and
 * qpdf, tools outside the project: text extraction proves the embedded glyphs map back to the right characters.
 */
import { describe, it, expect, beforeAll } from 'vitest';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { renderPdf } from '../../src/render/pdf.js';
import { sampleModel, VERDICT_TEXTS, LONG_STATEMENT, CHANGES, NOTICE_TEXTS } from './sample-model.js';

const dir = mkdtempSync(join(tmpdir(), 'warrant-render-'));
let pdf: Buffer;
let pdfPath: string;

function run(cmd: string, args: string[]): string {
  return execFileSync(cmd, args, { encoding: 'utf8' });
}

/** pdftotext output with line breaks and runs of spaces folded, so wrapped paragraphs can be searched whole. */
function plainText(path: string): string {
  return run('pdftotext', ['-enc', 'UTF-8', path, '-']).replace(/\s+/g, ' ');
}

beforeAll(async () => {
  pdf = await renderPdf(sampleModel);
  pdfPath = join(dir, 'sample.pdf');
  writeFileSync(pdfPath, pdf);
});

describe('renderPdf on the sample model', () => {
  it('writes a PDF 1.7 file', () => {
    expect(pdf.subarray(0, 8).toString('latin1')).toBe('%PDF-1.7');
  });

  it('pdfinfo reports the title, a tagged file, A4 pages and a plausible page count', () => {
    const info = run('pdfinfo', [pdfPath]);
    expect(info).toMatch(/^Title:\s+Student voice claims 2024: Coleg Ŵennalt and partners$/m);
    expect(info).toMatch(/^Tagged:\s+yes$/m);
    expect(info).toMatch(/^Page size:\s+595\.28 x 841\.89 pts \(A4\)$/m);
    const pages = Number(/^Pages:\s+(\d+)$/m.exec(info)?.[1]);
    // Cover, summary, at least one page per two claims (nine claims), and at least one closing page.
    expect(pages).toBeGreaterThanOrEqual(8);
    expect(pages).toBeLessThanOrEqual(18);
  });

  it('pdftotext finds every verdict paragraph, whole and with accents intact', () => {
    const text = plainText(pdfPath);
    for (const paragraph of Object.values(VERDICT_TEXTS)) expect(text).toContain(paragraph);
    for (const name of ['Coleg Ŵennalt', 'Ysgol Brynŷs', 'Szkoła Łąka', 'Naïve Arts', 'Cefnŷdd', 'Łóźmir']) {
      expect(text).toContain(name);
    }
  });

  it('wraps the long statement in the summary table and the claim heading without losing words', () => {
    const text = plainText(pdfPath);
    // The claim heading prints the whole statement once as running text.
    expect(text).toContain(LONG_STATEMENT);
    // In the summary table the statement is wrapped inside its column: every word is present.
    // In the summary table the statement is wrapped inside its cell; the tagged cell holds it whole (pdftotext alone
    // would drop the hyphen of a word broken after it).
    const tree = run('pdfinfo', ['-struct-text', pdfPath]);
    const summary = tree.slice(tree.indexOf('"Summary"'), tree.indexOf('CLAIM C1'));
    expect(summary).toContain(`"${LONG_STATEMENT}"`);
    const summaryPage = run('pdftotext', ['-enc', 'UTF-8', '-f', '2', '-l', '2', pdfPath, '-']);
    expect(summaryPage).toContain('Departments in the Faculty of Health');
    expect(summaryPage).toContain('2023 timetable');
  });

  it('numbers every page "Page N of M"', () => {
    const info = run('pdfinfo', [pdfPath]);
    const pages = Number(/^Pages:\s+(\d+)$/m.exec(info)?.[1]);
    const text = plainText(pdfPath);
    for (let n = 1; n <= pages; n++) expect(text).toContain(`Page ${n} of ${pages}`);
  });

  it('has a structure tree in reading order with headings, tables, lists and figures with alt text', () => {
    const tree = run('pdfinfo', ['-struct', pdfPath]);
    for (const tag of ['Document', 'H1', 'H2', 'H3', 'P', 'Table', 'TR', 'TH', 'TD', 'L', 'LI', 'LBody', 'Figure']) {
      expect(tree).toMatch(new RegExp(`^\\s*${tag}\\b`, 'm'));
    }
    expect((tree.match(/^\s*Figure\b/gm) ?? []).length).toBe(sampleModel.claims.filter((c) => c.chart).length);
    const withText = run('pdfinfo', ['-struct-text', pdfPath]);
    const firstClaim = withText.indexOf('CLAIM C1');
    const lastClaim = withText.indexOf('CLAIM C5');
    const glossary = withText.indexOf('Glossary');
    expect(firstClaim).toBeGreaterThan(withText.indexOf('Summary'));
    expect(lastClaim).toBeGreaterThan(firstClaim);
    expect(glossary).toBeGreaterThan(lastClaim);
  });

  it('gives each figure its alt text in the structure tree', () => {
    // qpdf's JSON view decodes PDF text strings (UTF-16 or PDFDocEncoding) to "u:..." values.
    const json = run('qpdf', ['--json', '--json-key=qpdf', pdfPath]);
    const alts = [...json.matchAll(/"\/Alt": "u:((?:[^"\\]|\\.)*)"/g)].map((m) => JSON.parse(`"${m[1]}"`) as string);
    const expected = sampleModel.claims.flatMap((c) => (c.chart ? [c.chart.alt] : []));
    expect(alts).toEqual(expected);
    expect(json).toContain('"/Lang": "u:en-GB"');
  });

  it('has a bookmark for every main section and every claim', () => {
    const qdf = run('qpdf', ['--json', '--json-key=outlines', pdfPath]);
    const outlines = JSON.parse(qdf).outlines as Array<{ title: string; kids: Array<{ title: string }> }>;
    const titles = outlines.map((o) => o.title);
    expect(titles).toEqual([
      'Cover',
      'Summary',
      CHANGES.heading,
      'Claims',
      'General cautions',
      'Method notes',
      'Glossary',
      'Reproducibility',
    ]);
    const claims = outlines.find((o) => o.title === 'Claims')!.kids.map((k) => k.title.split(':')[0]);
    expect(claims).toEqual(sampleModel.claims.map((c) => c.id));
  });

  it('is byte-identical when rendered twice, and the date option is the only date written', async () => {
    const again = await renderPdf(sampleModel);
    expect(Buffer.compare(pdf, again)).toBe(0);
    const dated = await renderPdf(sampleModel, { createdAt: new Date(Date.UTC(2024, 5, 3, 12, 0, 0)) });
    expect(Buffer.compare(pdf, dated)).not.toBe(0);
    const datedPath = join(dir, 'dated.pdf');
    writeFileSync(datedPath, dated);
    expect(run('pdfinfo', ['-isodates', datedPath])).toMatch(/^CreationDate:\s+2024-06-03T12:00:00/m);
  });

  it('reads in order: the title first, then the summary, then what changed, then the claims', () => {
    // pdfinfo -struct-text prints the structure tree with each element's text, in the tree's (reading) order.
    const tree = run('pdfinfo', ['-struct-text', pdfPath]);
    const firstText = /"([^"]+)"/.exec(tree.slice(tree.indexOf('H1')))?.[1];
    expect(tree.indexOf('H1')).toBeLessThan(tree.indexOf('"Summary"'));
    expect(firstText).toBe(sampleModel.title);
    const before = tree.slice(0, tree.indexOf('H1'));
    expect(before).not.toMatch(/"[^"]*(Summary|CLAIM)[^"]*"/);
    const summary = tree.indexOf('"Summary"');
    const changes = tree.indexOf(`"${CHANGES.heading}"`);
    expect(changes).toBeGreaterThan(summary);
    expect(tree.indexOf('CLAIM C1')).toBeGreaterThan(changes);
    // Every verdict change is in a table row, claim, before, after and why in that order.
    for (const v of CHANGES.verdicts) {
      const at = tree.indexOf(`"${v.claim}"`);
      expect(at).toBeGreaterThan(changes);
      expect(tree.indexOf(`"${v.before}"`, at)).toBeGreaterThan(at);
      expect(tree.indexOf(`"${v.why}"`, at)).toBeGreaterThan(tree.indexOf(`"${v.after}"`, at));
    }
    for (const note of CHANGES.notes) expect(tree).toContain(`"${note}"`);
  });

  it('draws a claim notice under its verdict and before the verdict paragraph', () => {
    const tree = run('pdfinfo', ['-struct-text', pdfPath]);
    const claim = tree.indexOf('CLAIM C2');
    const notice = tree.indexOf(`"${NOTICE_TEXTS.C2}"`);
    expect(notice).toBeGreaterThan(tree.indexOf('"Not supported"', claim));
    expect(notice).toBeLessThan(tree.indexOf(VERDICT_TEXTS.C2.slice(0, 40), claim));
    expect(tree.slice(claim, notice)).toContain('"NOTE"');
    // Only the claim that has a notice shows one.
    expect((tree.match(/"NOTES?"/g) ?? []).length).toBe(1);
  });

  it('lists each verdict word on the summary page with its count of claims', () => {
    const page = run('pdftotext', ['-enc', 'UTF-8', '-f', '2', '-l', '2', pdfPath, '-']).replace(/\s+/g, ' ');
    for (const label of new Set(sampleModel.summary.map((r) => r.verdictLabel))) {
      const n = sampleModel.summary.filter((r) => r.verdictLabel === label).length;
      expect(page).toContain(`${label} ${n} ${n === 1 ? 'claim' : 'claims'}`);
    }
  });

  it('sets no text below 8 pt (word boxes from pdftotext -bbox)', () => {
    // pdftotext -bbox gives each word's box from the font's ascent to its descent; Noto Sans has ascent 1069 and
    // descent -293 per 1000 units (read from the font file with fontkit), so a box is 1.362 times the font size.
    const html = run('pdftotext', ['-bbox', pdfPath, '-']);
    const heights = [...html.matchAll(/yMin="([\d.]+)" xMax="[\d.]+" yMax="([\d.]+)"/g)].map((m) => Number(m[2]) - Number(m[1]));
    expect(heights.length).toBeGreaterThan(500);
    expect(Math.min(...heights)).toBeGreaterThanOrEqual(8 * 1.362 - 0.01);
  });

  it('qpdf finds no structural damage', () => {
    expect(run('qpdf', ['--check', pdfPath])).toMatch(/No syntax or stream encoding errors found/);
  });

  it('refuses a model without a title', async () => {
    await expect(renderPdf({ ...sampleModel, title: '  ' })).rejects.toThrow(/title is empty/);
  });
});

describe('renderPdf with a long summary and a many-row chart', () => {
  const rows = Array.from({ length: 40 }, (_, i) => ({
    id: `C${i + 1}`,
    statement: `Claim number ${i + 1} about Ysgol Brynŷs: ${'the rate of agreement is different here '.repeat(1 + (i % 3))}`.trim(),
    verdict: (['supported', 'not-supported', 'opposite', 'too-little-data'] as const)[i % 4]!,
    verdictLabel: ['Supported', 'Not supported', 'Points the other way', 'Too little data'][i % 4]!,
    keyFigure: `${50 + i}% vs 60%`,
  }));
  const base = sampleModel.claims[0]!;
  const model = {
    ...sampleModel,
    summary: rows,
    claims: [
      {
        ...base,
        chart: {
          alt: 'Dot chart of eight campuses.',
          data: {
            kind: 'rates' as const,
            axisTitle: 'Agreeing (%)',
            bars: Array.from({ length: 8 }, (_, i) => ({
              label: `Campus ${String.fromCharCode(65 + i)} Łąka`,
              rate: 0.5 + i * 0.03,
              lower: 0.45 + i * 0.03,
              upper: 0.55 + i * 0.03,
              n: 100 + i,
            })),
            reference: { value: 0.7, label: 'Regional rate 70%' },
          },
        },
      },
    ],
  };
  let path: string;

  beforeAll(async () => {
    path = join(dir, 'long.pdf');
    writeFileSync(path, await renderPdf(model));
  });

  it('continues the summary table over pages, repeating the header row, and loses no row', () => {
    const info = run('pdfinfo', [path]);
    const pages = Number(/^Pages:\s+(\d+)$/m.exec(info)?.[1]);
    const summaryPages: string[] = [];
    for (let p = 2; p <= pages; p++) {
      const text = run('pdftotext', ['-enc', 'UTF-8', '-f', String(p), '-l', String(p), path, '-']);
      if (/Claim number/.test(text)) summaryPages.push(text);
    }
    expect(summaryPages.length).toBeGreaterThanOrEqual(2);
    for (const text of summaryPages) expect(text).toContain('Key figure');
    const all = summaryPages.join('\n').replace(/\s+/g, ' ');
    for (const r of rows) expect(all).toContain(`${r.keyFigure}`);
    for (let i = 1; i <= 40; i++) expect(all).toContain(`Claim number ${i} about Ysgol Brynŷs`);
  });

  it('tags the repeated header rows as page furniture, so the structure tree has one header row', () => {
    const tree = run('pdfinfo', ['-struct-text', path]);
    const summaryTable = tree.slice(tree.indexOf('Summary'), tree.indexOf('CLAIM C1'));
    expect((summaryTable.match(/"Key figure \(interval\)"/g) ?? []).length).toBe(1);
  });
});

describe('the per-claim fields on a claim page', () => {
  // Three forms of the verdict at other levels: the same everywhere (one line), changing with the level and the
  // adjustment (a grid of two lines), and changing with the level where no adjustment applies (a grid of one line).
  const cell = (level: string, own: boolean, adjusted: 'supported' | 'not-supported', unadjusted: 'supported' | 'not-supported') => ({
    level,
    own,
    adjusted,
    adjustedLabel: adjusted === 'supported' ? 'Supported' : 'Not supported',
    unadjusted,
    unadjustedLabel: unadjusted === 'supported' ? 'Supported' : 'Not supported',
  });
  const base = { heading: 'Verdict at each confidence level', adjustedLabel: 'Adjusted for 5 claims', unadjustedLabel: 'Not adjusted' };
  const model = {
    ...sampleModel,
    claims: sampleModel.claims.map((c, i) => {
      if (i === 0) {
        return {
          ...c,
          advice: { action: 'quote' as const, label: 'Quote as written', reason: 'The interval excludes no difference.' },
          sourceLine: 'Source: Regional Survey 2024, an independent release (region.xlsx). Response rate: 38% of those eligible answered.',
          terms: [{ term: "Cohen's h", text: 'A measure of the gap between two rates.' }],
          stability: {
            ...base,
            cells: [cell('90%', false, 'supported', 'supported'), cell('95%', true, 'supported', 'supported'), cell('99%', false, 'supported', 'supported')],
            adjustmentApplies: true,
            dependsOnLevel: false,
            dependsOnAdjustment: false,
            text: 'Supported at 90%, 95% and 99% confidence, with or without the adjustment for 5 claims.',
          },
        };
      }
      if (i === 1) {
        return {
          ...c,
          advice: {
            action: 'reword' as const,
            label: 'Reword',
            reason: 'The interval rules out a fall of 9 points or more.',
            wording: 'Satisfaction at Ysgol Brynŷs fell by less than 9 points.',
          },
          linked: [{ id: 'C3', verdictLabel: 'Supported', text: 'Claim C3 tests the same data: Supported.' }],
          sourceLine: "Source: Our own pulse survey, the organisation's own survey (pulse.csv). Response rate: unknown.",
          stability: {
            ...base,
            cells: [cell('90%', false, 'supported', 'supported'), cell('95%', true, 'not-supported', 'supported'), cell('99%', false, 'not-supported', 'not-supported')],
            adjustmentApplies: true,
            dependsOnLevel: true,
            dependsOnAdjustment: true,
            text: 'Adjusted for 5 claims: supported at 90%, not supported at 95% and 99%. Not adjusted: supported at 90% and 95%, not supported at 99%.',
          },
        };
      }
      if (i === 2) {
        return {
          ...c,
          stability: {
            ...base,
            cells: [cell('90%', false, 'supported', 'supported'), cell('95%', true, 'supported', 'supported'), cell('99%', false, 'not-supported', 'not-supported')],
            adjustmentApplies: false,
            dependsOnLevel: true,
            dependsOnAdjustment: false,
            text: 'Supported at 90% and 95%, not supported at 99%.',
          },
        };
      }
      return c;
    }),
  };
  let text: string[];
  let layout: string;
  beforeAll(async () => {
    const path = join(dir, 'fields.pdf');
    writeFileSync(path, await renderPdf(model));
    text = run('pdftotext', ['-enc', 'UTF-8', path, '-']).split('\f').map((p) => p.replace(/\s+/g, ' '));
    const page = text.findIndex((p) => p.includes('CLAIM C3') && !p.includes('CLAIM C3 (CONTINUED)')) + 1;
    layout = run('pdftotext', ['-enc', 'UTF-8', '-layout', '-f', String(page), '-l', String(page), path, '-']);
  });
  const pageOf = (id: string): string => text.find((p) => p.includes(`CLAIM ${id}`) && !p.includes(`CLAIM ${id} (CONTINUED)`))!;

  it('draws the advice under the verdict paragraph, then the suggested wording and the claims to read with it', () => {
    const c1 = pageOf('C1');
    expect(c1).toContain('What to do Quote as written.');
    // Quoting needs no reason beyond the verdict paragraph.
    expect(c1).not.toContain('The interval excludes no difference.');
    const c2 = pageOf('C2');
    const at = c2.indexOf('What to do Reword. The interval rules out a fall of 9 points or more.');
    expect(at).toBeGreaterThan(c2.indexOf(VERDICT_TEXTS.C2.slice(0, 40)));
    expect(c2.indexOf('Suggested wording Satisfaction at Ysgol Brynŷs fell by less than 9 points.')).toBeGreaterThan(at);
    expect(c2.indexOf('Read with Claim C3 tests the same data: Supported.')).toBeGreaterThan(at);
    expect(c2.indexOf('What was compared and tested')).toBeGreaterThan(at);
  });

  it('prints the source line, the term notes and the verdict at each level in its three forms', () => {
    const c1 = pageOf('C1');
    expect(c1).toContain('Source: Regional Survey 2024, an independent release (region.xlsx). Response rate: 38% of those eligible answered.');
    expect(c1).toContain("Cohen's h: A measure of the gap between two rates.");
    expect(c1).toContain('Supported at 90%, 95% and 99% confidence, with or without the adjustment for 5 claims.');
    const c2 = pageOf('C2');
    expect(c2).toContain('Response rate: unknown.');
    expect(c2).toContain('Verdict at each confidence level 90% 95% 99%');
    expect(c2).toContain('Adjusted for 5 claims Supported Not supported Not supported');
    expect(c2).toContain('Not adjusted Supported Supported Not supported');
    // Where no adjustment applies, one line named by the heading and no "Adjusted" line.
    const c3 = pageOf('C3');
    // Read as laid out (pdftotext -layout): the levels over the one line, whose cells follow its label.
    const lines = layout.split('\n').map((l) => l.trim().replace(/\s+/g, ' '));
    const row = lines.findIndex((l) => l.startsWith('Verdict at each confidence level'));
    expect(lines[row]).toBe('Verdict at each confidence level Supported Supported Not supported');
    expect(lines.slice(row - 2, row).join(' ')).toContain('90% 95% 99%');
    expect(c3).not.toContain('Adjusted for 5 claims');
    expect(c3).not.toContain('Not adjusted');
  });
});
