/**
 * Whatever text a user hands us, the reader either returns a claims file or throws an InputError whose problems all
 * carry a place, a problem and a fix; nothing else escapes (no TypeError, no stack trace for the user).
 */
import { readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { parseClaimsText } from '../../src/claims/read.js';

const here = dirname(fileURLToPath(import.meta.url));
const fixtures = resolve(here, '../fixtures/claims');
const opts = { absPath: join(fixtures, 'fuzz.yaml'), file: 'fuzz.yaml', sha256: '0'.repeat(64) };
const valid = readFileSync(join(fixtures, 'valid-compare.yaml'), 'utf8') + readFileSync(join(fixtures, 'valid-association.yaml'), 'utf8').split('claims:\n')[1]!.replace(/^/gm, '').replace(/source: people/, 'source: results');

function onlyInputErrors(text: string): void {
  try {
    parseClaimsText(text, opts);
  } catch (e) {
    if (!(e instanceof InputError)) throw new Error(`not an InputError for ${JSON.stringify(text.slice(0, 200))}: ${String(e)}`);
    expect(e.problems.length).toBeGreaterThan(0);
    for (const p of e.problems) {
      expect(p.problem.length).toBeGreaterThan(0);
      expect(p.fix.length).toBeGreaterThan(0);
      expect(p.line === undefined || p.line >= 1).toBe(true);
      expect(p.column === undefined || p.column >= 1).toBe(true);
    }
  }
}

/** Edits that people (and editors) make by accident. */
const mutation = fc.oneof(
  fc.record({ op: fc.constant('delete' as const), at: fc.nat(), len: fc.integer({ min: 1, max: 12 }) }),
  fc.record({ op: fc.constant('insert' as const), at: fc.nat(), text: fc.string({ unit: fc.constantFrom(...' \t\n:-[]{}"\'&*!|>#%@`,?0123456789abcxyz_.'.split('')), maxLength: 8 }) }),
  fc.record({ op: fc.constant('dupline' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('swaplines' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('indent' as const), at: fc.nat(), by: fc.integer({ min: -4, max: 4 }) }),
);
type Mutation = typeof mutation extends fc.Arbitrary<infer T> ? T : never;

function apply(text: string, m: Mutation): string {
  const lines = text.split('\n');
  switch (m.op) {
    case 'delete': {
      const at = m.at % (text.length + 1);
      return text.slice(0, at) + text.slice(at + m.len);
    }
    case 'insert': {
      const at = m.at % (text.length + 1);
      return text.slice(0, at) + m.text + text.slice(at);
    }
    case 'dupline': {
      const i = m.at % lines.length;
      lines.splice(i, 0, lines[i]!);
      return lines.join('\n');
    }
    case 'swaplines': {
      const i = m.at % Math.max(1, lines.length - 1);
      [lines[i], lines[i + 1]] = [lines[i + 1] ?? '', lines[i]!];
      return lines.join('\n');
    }
    case 'indent': {
      const i = m.at % lines.length;
      lines[i] = m.by >= 0 ? ' '.repeat(m.by) + lines[i] : lines[i]!.replace(new RegExp(`^ {0,${-m.by}}`), '');
      return lines.join('\n');
    }
  }
}

describe('the reader never throws anything but InputError', () => {
  it('the unmutated base text is valid', () => {
    expect(parseClaimsText(valid, opts).claims).toHaveLength(3);
  });

  it('random text', () => {
    fc.assert(fc.property(fc.string({ maxLength: 300 }), onlyInputErrors), { numRuns: 500 });
  });

  it('random YAML-ish text', () => {
    const yamlish = fc.string({ unit: fc.constantFrom(...' \n:-[]{}"\'&*!|>#%@,?abc1_'.split('')), maxLength: 200 });
    fc.assert(fc.property(yamlish, onlyInputErrors), { numRuns: 1000 });
  });

  it('valid claims files with a few accidental edits', () => {
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 4 }), (ms) => {
        onlyInputErrors(ms.reduce(apply, valid));
      }),
      { numRuns: 1500 },
    );
  });

  it('random JSON-like values in place of the whole document', () => {
    fc.assert(
      fc.property(fc.jsonValue({ maxDepth: 4 }), (v) => onlyInputErrors(JSON.stringify(v))),
      { numRuns: 300 },
    );
  });
});
