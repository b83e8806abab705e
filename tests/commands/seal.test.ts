/**
 * `warrant seal` through the CLI entry (src/cli.ts main), then packs built from the sealed claims, read back with
 * poppler's pdftotext. The demo claims and data are copied into a scratch folder so the seal sits beside them.
 */
import { execFileSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { main } from '../../src/cli.js';
import { build } from '../../src/pipeline.js';
import { sealPath } from '../../src/commands/seal.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-seal-'));
const claims = join(work, 'claims.yaml');
const fold = (s: string) => s.replace(/\s+/g, ' ');
const pdfText = (pdf: string) => fold(execFileSync('pdftotext', ['-enc', 'UTF-8', pdf, '-'], { encoding: 'utf8' }));

async function cli(...args: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  try {
    const code = await main(args);
    return { code, out, err };
  } finally {
    o.mockRestore();
    e.mockRestore();
  }
}

// How many claims the demo holds, counted from its claims file (so the test follows the demo as it grows).
const n = (readFileSync(join(root, 'demo/claims.yaml'), 'utf8').match(/^  - id: /gm) ?? []).length;

beforeAll(() => {
  cpSync(join(root, 'demo/data'), join(work, 'data'), { recursive: true });
  cpSync(join(root, 'demo/claims.yaml'), claims);
});
afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('warrant seal', () => {
  it('says, with no seal, that it cannot confirm when the claims were written (and no longer claims it knows)', async () => {
    const pack = await build({ claimsPath: claims, outDir: join(work, 'out0'), cwd: work });
    const text = pdfText(pack.files.pdf);
    expect(text).toContain('This pack cannot confirm when these claims were written: no seal was found beside the claims file');
    expect(text).not.toContain('written before the results were seen');
    expect(JSON.parse(readFileSync(pack.files.results, 'utf8')).seal).toBeNull();
  });

  it('records every claim and the date given, and the pack states it against the data date', async () => {
    const r = await cli('seal', claims, '--date', '2026-02-12');
    expect(r.code).toBe(0);
    expect(r.out).toContain(`Sealed ${n} claims on 2026-02-12`);
    const file = JSON.parse(readFileSync(sealPath(claims), 'utf8'));
    expect(file.claims).toHaveLength(n);
    expect(new Set(file.claims.map((c: { sealed: string }) => c.sealed))).toEqual(new Set(['2026-02-12']));
    const pack = await build({ claimsPath: claims, outDir: join(work, 'out1'), cwd: work });
    // The demo's data_date is 2026-03-03.
    expect(pack.model.sealText).toBe(`These ${n} claims were sealed on 12 February 2026, before the data file dated 3 March 2026.`);
    expect(pdfText(pack.files.pdf)).toContain(pack.model.sealText);
    const results = JSON.parse(readFileSync(pack.files.results, 'utf8'));
    expect(results.seal).toMatchObject({ firstSealed: '2026-02-12', lastSealed: '2026-02-12', beforeData: true, addedOrEdited: [] });
    expect(results.seal.sealed).toHaveLength(n);
  });

  it('counts claims edited or added after sealing, marks them, and keeps the first date on a second seal', async () => {
    const text = readFileSync(claims, 'utf8');
    // Edit one claim's words and add a copy of another under a new id.
    const edited = text.replace('More of our students know where to turn for wellbeing support than last year.', 'More of our students than last year know where to turn for wellbeing support.');
    const added = edited.replace(/\n  - id: feedback-below-region\n/, '\n  - id: feedback-below-region-copy\n    claim: Our feedback rate is below the region.\n    kind: compare\n    source: lanternfield\n    where: { Year: latest, Question: Q03 }\n    focus: { Institution: Quarrendell University }\n    against: { Region: Glasvane Reach }\n    expect: lower\n  - id: feedback-below-region\n');
    expect(added).not.toBe(text);
    writeFileSync(claims, added);
    const pack = await build({ claimsPath: claims, outDir: join(work, 'out2'), cwd: work });
    // n sealed, one of them edited, one added: n - 1 of n + 1 as sealed.
    expect(pack.model.sealText).toBe(`${n - 1} of these ${n + 1} claims were sealed on 12 February 2026, before the data file dated 3 March 2026; 2 claims were added or edited after sealing.`);
    const results = JSON.parse(readFileSync(pack.files.results, 'utf8'));
    expect(results.seal.addedOrEdited.sort()).toEqual(['feedback-below-region-copy', 'wellbeing-up-this-year']);
    const notice = pack.model.claims.find((c) => c.id === 'wellbeing-up-this-year')?.notices ?? [];
    expect(notice).toContain('This claim was added or edited after the claims were sealed on 12 February 2026: the seal does not show that it was written before the data were seen.');
    // Sealing again on a later day: unchanged claims keep 12 February, the two new ones get the new day.
    const r = await cli('seal', claims, '--date', '2026-03-05');
    expect(r.code).toBe(0);
    const file = JSON.parse(readFileSync(sealPath(claims), 'utf8'));
    const days = Object.fromEntries(file.claims.map((c: { id: string; sealed: string }) => [c.id, c.sealed]));
    expect(days['wellbeing-up-this-year']).toBe('2026-03-05');
    expect(days['feedback-below-region']).toBe('2026-02-12');
    const again = await build({ claimsPath: claims, outDir: join(work, 'out3'), cwd: work });
    expect(again.model.sealText).toBe(`These ${n + 1} claims were sealed between 12 February 2026 and 5 March 2026, not before the data file dated 3 March 2026, so the seal does not show they were written before the data were seen.`);
  });

  it('refuses a date that is not a day, and a damaged seal, with exit code 2 and one paragraph', async () => {
    const bad = await cli('seal', claims, '--date', '2026-02-30');
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('2026-02-30');
    expect(bad.err).toContain('YYYY-MM-DD');
    expect(bad.err).not.toMatch(/\n\s+at /);
    writeFileSync(sealPath(claims), '{ not json');
    await expect(build({ claimsPath: claims, outDir: join(work, 'out4'), cwd: work })).rejects.toThrow(/seal is not valid JSON/);
  });
});
