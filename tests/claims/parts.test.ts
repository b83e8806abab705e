import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readConfidence } from '../../src/claims/confidence.js';
import { claimsSchema, claimsSchemaPath, claimsValidator, type JsonSchema } from '../../src/claims/schema.js';
import { closest, editDistance } from '../../src/suggest.js';

describe('edit distance', () => {
  it('matches published worked examples', () => {
    // Levenshtein distance kitten -> sitting is 3 (the standard textbook example; from memory).
    expect(editDistance('kitten', 'sitting')).toBe(3);
    // Optimal string alignment distance CA -> ABC is 3, whereas unrestricted Damerau-Levenshtein gives 2
    // (the example used to contrast the two; from memory).
    expect(editDistance('ca', 'abc')).toBe(3);
    // One adjacent transposition costs 1 (Damerau 1964: the four single-error kinds each cost one).
    expect(editDistance('agaisnt', 'against')).toBe(1);
    expect(editDistance('', 'abc')).toBe(3);
    expect(editDistance('abc', 'abc')).toBe(0);
  });

  it('suggests only plausible slips', () => {
    const keys = ['title', 'organisation', 'min_respondents', 'adjust', 'claims', 'sources'];
    expect(closest('minRespondents', keys)).toBe('min_respondents');
    expect(closest('organization', keys)).toBe('organisation');
    expect(closest('claim', keys)).toBe('claims');
    expect(closest('colour', keys)).toBeUndefined();
  });
});

describe('confidence levels as written', () => {
  // The three accepted forms; 95/100 rounds to the same double as the literal 0.95 (IEEE 754 division is correctly
  // rounded; common practice).
  it.each([
    [0.95, 0.95, '0.95'],
    [95, 0.95, '95'],
    ['95%', 0.95, '95%'],
    ['95 %', 0.95, '95 %'],
    [' 90% ', 0.9, '90%'],
    ['99.9%', 0.999, '99.9%'],
    [0.999, 0.999, '0.999'],
    [80, 0.8, '80'],
  ])('%j is read as %d', (raw, value, written) => {
    expect(readConfidence(raw)).toEqual({ ok: true, value, written });
  });

  it.each([[1.5], [150], [1], [0.5], [50], ['50%'], [99.95], ['abc'], ['95%%'], [true], [null], [-0.9]])(
    '%j is refused',
    (raw) => {
      expect(readConfidence(raw).ok).toBe(false);
    },
  );
});

describe('the shipped schema', () => {
  it('is found from the package root and is draft-07', () => {
    const text = readFileSync(claimsSchemaPath(), 'utf8');
    expect(JSON.parse(text).$schema).toBe('http://json-schema.org/draft-07/schema#');
  });

  it('describes every property in plain words, for editors', () => {
    const missing: string[] = [];
    const walk = (s: JsonSchema | boolean | undefined, where: string): void => {
      if (s === undefined || typeof s === 'boolean') return;
      for (const [k, v] of Object.entries(s.properties ?? {})) {
        if (typeof v === 'boolean') continue; // a key forbidden for one kind of claim or shape of source
        if (typeof v.description !== 'string' || v.description.length < 10) {
          // A $ref to a described definition counts.
          const ref = typeof v.$ref === 'string' ? claimsSchema().definitions?.[v.$ref.split('/').pop()!] : undefined;
          if (!ref?.description) missing.push(`${where}.${k}`);
        }
        walk(v, `${where}.${k}`);
      }
      for (const b of s.allOf ?? []) walk(b.then, where);
    };
    const schema = claimsSchema();
    walk(schema, '#');
    for (const [name, def] of Object.entries(schema.definitions ?? {})) {
      expect(def.description, name).toBeTypeOf('string');
      walk(def, `#/definitions/${name}`);
    }
    expect(missing).toEqual([]);
  });

  it('accepts the example in src/claims/types.ts and refuses a typo in it', () => {
    const example = {
      title: 'Student voice 2026',
      organisation: "Tarnquill Students' Guild",
      confidence: '95%',
      sources: {
        results: { file: 'data/summary.xlsx', sheet: 'Results', shape: 'summary', respondents: 'Respondents', agree: 'Agreeing' },
      },
      claims: [
        {
          id: 'feedback-below-region',
          claim: 'Our rate of agreement on feedback is below the rest of the region.',
          kind: 'compare',
          source: 'results',
          where: { year: 2026, question: 'Q09' },
          focus: { provider: 'Tarnquill College' },
          against: { region: 'Glimmerholt Vale' },
          expect: 'lower',
        },
      ],
    };
    const validate = claimsValidator();
    expect(validate(example), JSON.stringify(validate.errors)).toBe(true);
    const typo = structuredClone(example) as Record<string, unknown>;
    (typo.claims as Array<Record<string, unknown>>)[0]!.exepct = 'lower';
    expect(validate(typo)).toBe(false);
  });
});
