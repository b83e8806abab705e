/**
 * Claims files written inline in tests: read as if they were tests/fixtures/claims/inline.yaml (data paths resolve
 * from that folder), and the problems a rejected one gives.
 */
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseClaimsText } from '../../src/claims/read.js';
import { InputError, type Problem } from '../../src/errors.js';

const fixtures = resolve(dirname(fileURLToPath(import.meta.url)), '../fixtures/claims');

/** The reading options of an inline claims file: named inline.yaml in tests/fixtures/claims. */
export const inlineOpts = { absPath: join(fixtures, 'inline.yaml'), file: 'inline.yaml', sha256: 'f'.repeat(64) };

/** The problems of an inline claims file that must be rejected; throws if it is accepted. */
export function problems(text: string): Problem[] {
  try {
    parseClaimsText(text, inlineOpts);
  } catch (e) {
    if (e instanceof InputError) return e.problems;
    throw e;
  }
  throw new Error('accepted');
}
