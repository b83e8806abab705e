/**
 * `--templates DIR` end to end: a folder holding one reworded verdict template replaces that paragraph in the PDF and
 * nowhere else. The demo claims file is built twice with build() (built-in wording, then the folder), and each PDF is
 * read back with poppler's pdftotext, a tool outside the project.
 *
 * The reworded template uses only fixed words and the two group labels, so the sentence expected in the PDF is known
 * in full from the demo data: the claim feedback-below-region compares Quarrendell University with the rest of
 * Glasvane Reach, and it is the only compare claim the demo supports.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { build, type BuildResult } from '../../src/pipeline.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-templates-'));
const templatesDir = join(work, 'wording');

/** The replacement for templates/compare.supported.mustache. */
const REWORDED = 'Holds up, in our reading: {{focus.label}} trails {{against.label}} on this question.';
/** What it must print for the demo's feedback-below-region claim. */
const EXPECTED = 'Holds up, in our reading: Quarrendell University trails the rest of Glasvane Reach on this question.';
/** A phrase only the built-in compare.supported template writes (templates/compare.supported.mustache). */
const BUILT_IN_PHRASE = 'A gap this large would be very unlikely if the two rates were really the same';

let plain: BuildResult;
let reworded: BuildResult;

/** The PDF's text with every run of white space folded to one space (pdftotext breaks lines where the PDF does). */
function pdfText(path: string): string {
  return execFileSync('pdftotext', ['-enc', 'UTF-8', path, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

beforeAll(async () => {
  mkdirSync(templatesDir);
  writeFileSync(join(templatesDir, 'compare.supported.mustache'), `${REWORDED}\n`);
  plain = await build({ claimsPath: 'demo/claims.yaml', outDir: join(work, 'plain'), cwd: root });
  reworded = await build({ claimsPath: 'demo/claims.yaml', outDir: join(work, 'reworded'), cwd: root, templatesDir });
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

describe('--templates DIR', () => {
  it('prints the reworded paragraph in the claim section instead of the built-in one', () => {
    const before = pdfText(plain.files.pdf);
    const after = pdfText(reworded.files.pdf);
    // The built-in wording is in the plain pack (so the claim does reach this template) and gone from the other.
    expect(before).toContain(BUILT_IN_PHRASE);
    expect(before).not.toContain('Holds up, in our reading');
    expect(after).toContain(EXPECTED);
    expect(after).not.toContain(BUILT_IN_PHRASE);
    const section = reworded.model.claims.find((c) => c.id === 'feedback-below-region');
    expect(section?.verdictText).toBe(EXPECTED);
  });

  it('changes that paragraph only: every other claim keeps its built-in verdict paragraph and verdict word', () => {
    const after = pdfText(reworded.files.pdf);
    const others = plain.model.claims.filter((c) => c.id !== 'feedback-below-region');
    expect(others.length).toBeGreaterThan(5);
    for (const claim of others) {
      const twin = reworded.model.claims.find((c) => c.id === claim.id);
      expect(twin?.verdictText).toBe(claim.verdictText);
      expect(after).toContain(claim.verdictText.replace(/\s+/g, ' '));
    }
    // The badge word comes from verdict.supported.mustache, which the folder does not replace.
    expect(reworded.model.claims.find((c) => c.id === 'feedback-below-region')?.verdictLabel).toBe('Supported');
  });

  it('gives the reworded pack its own folder, since its wording differs', () => {
    expect(reworded.results.fingerprint).not.toBe(plain.results.fingerprint);
  });

  it('rejects a templates folder that does not exist, naming it', async () => {
    const missing = join(work, 'no-such-folder');
    await expect(build({ claimsPath: 'demo/claims.yaml', outDir: join(work, 'x'), cwd: root, templatesDir: missing })).rejects.toThrow(
      /no-such-folder/,
    );
  });
});
