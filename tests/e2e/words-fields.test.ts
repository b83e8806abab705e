/**
 * End to end: a claim whose own words and fields disagree is built (the verdict answers the fields), and the
 * disagreement is said on the terminal even with --quiet, as the first caution on the claim's page and in
 * results.json; a claim whose words agree with its fields carries no such caution. Data: the demo's 2026 release.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { bin, fold } from '../helpers/cli.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-words-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const CLAIMS = `title: Words and fields
organisation: Quarrendell Union of Students
sources:
  release:
    file: ${join(root, 'demo/data/2026/summary.xlsx')}
    sheet: Results
    shape: summary
    respondents: Respondents
    agree: Agreeing
    period: Year
claims:
  - id: below-tested-higher
    claim: Our students are less likely than the rest of the region to say feedback arrives in time.
    kind: compare
    where: { Year: latest, Question: Q03 }
    focus: { Institution: Quarrendell University }
    against: { Region: Glasvane Reach }
    expect: higher
  - id: target-as-written
    claim: We are still below the university's target of 80% content overall.
    kind: target
    where: { Year: latest, Question: Q08 }
    select: { Institution: Quarrendell University }
    value: 80%
    expect: lower
  - id: names-another-institution
    claim: Oxtrellis University is below the university's target of 80% content overall.
    kind: target
    where: { Year: latest, Question: Q08 }
    select: { Institution: Quarrendell University }
    value: 80%
    expect: lower
`;

describe('a claim whose words and fields disagree', () => {
  it('is built, warned about on the terminal, and cautioned on its page and in results.json', () => {
    writeFileSync(join(work, 'claims.yaml'), CLAIMS);
    const r = spawnSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', 'out', '--quiet'], { cwd: work, encoding: 'utf8' });
    expect(r.status).toBe(0);
    expect(r.stdout).toBe('');
    expect(r.stderr).toBe(
      'warrant: warning: claims.yaml:12:5: the claim\'s words say "less" (lower), but expect is higher, so the pack tests the opposite of what the words say, in claim "below-tested-higher" (field "expect", found "less"). Fix: If the words are right, set expect: lower; if the test is right, reword the claim (where agreeing is the unwelcome answer, say it in terms of agreeing).\n' +
        'warrant: warning: claims.yaml:26:5: the claim\'s words name "Oxtrellis University", a value of column "Institution", but select picks "Quarrendell University" there, which the words do not name, in claim "names-another-institution" (field "select", found "Oxtrellis University"). Fix: Select the Institution the words name (select: { Institution: Oxtrellis University }), or correct the words.\n',
    );
    const folder = join(work, 'out', readdirSync(join(work, 'out')).find((d) => d !== 'latest') as string);
    const results = JSON.parse(readFileSync(join(folder, 'results.json'), 'utf8')) as { claims: Array<{ id: string; cautions: string[] }> };
    const caution = 'The claim\'s own words and the way it was tested disagree: the words say "less" (lower), but the claim was tested as expecting higher. The verdict answers the test described under "What was compared and tested", not the words; correct the claims file before quoting this claim.';
    const [mismatched, agreeing, named] = results.claims;
    expect(named!.cautions[0]).toBe('The claim\'s own words and the way it was tested disagree: the words name "Oxtrellis University" (Institution), but select picks "Quarrendell University". The verdict answers the test described under "What was compared and tested", not the words; correct the claims file before quoting this claim.');
    expect(mismatched!.cautions[0]).toBe(caution);
    expect(agreeing!.cautions.join(' ')).not.toContain('own words');
    const text = fold(execFileSync('pdftotext', ['-enc', 'UTF-8', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' }));
    expect(text).toContain(caution);
    expect(text.split("The claim's own words").length - 1).toBe(2);
    // The summary marks the two claims whose words and fields disagree, and says once, under its table, what the
    // mark means; the claim whose words agree is not marked.
    const layout = execFileSync('pdftotext', ['-enc', 'UTF-8', '-layout', join(folder, 'pack.pdf'), '-'], { encoding: 'utf8' });
    const summary = layout.slice(layout.indexOf('The claims, and what to do with each'), layout.indexOf('CLAIM '));
    expect(summary.split('Words and test disagree*').length - 1).toBe(2);
    expect(fold(summary)).toContain('* Marked claims: the words of the claim say something other than what was tested (the first caution on its page says how). Its verdict and advice answer the test, not the words: correct the claims file before quoting the claim.');
    // Rows in the summary's order (must not make first, then file order): the marks fall in the first and third rows.
    const mark = 'Words and test disagree*';
    const first = summary.indexOf(mark);
    const second = summary.indexOf(mark, first + 1);
    const rowStart = (words: string) => summary.indexOf(words);
    expect(rowStart('Our students are less likely')).toBeLessThan(first);
    expect(first).toBeLessThan(rowStart('We are still below'));
    expect(second).toBeGreaterThan(rowStart('Oxtrellis University is below'));
    expect(second).toBeGreaterThan(summary.indexOf('target-as-written'));
  }, 60_000);
});
