import { mkdtempSync, writeFileSync, readFileSync } from 'node:fs';
import { createHash } from 'node:crypto';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { InputError, type Problem } from '../../src/errors.js';
import { MAX_CLAIMS_BYTES, readClaims } from '../../src/claims/read.js';
import type { ClaimsFile } from '../../src/claims/types.js';

const here = dirname(fileURLToPath(import.meta.url));
const fixtures = resolve(here, '../fixtures/claims');
const fx = (name: string): string => join(fixtures, name);

/** Read a fixture expected to fail; return its problems. */
async function problemsOf(path: string): Promise<Problem[]> {
  try {
    await readClaims(path, 'claims.yaml');
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return (e as InputError).problems;
  }
  throw new Error(`${path} was accepted but should have been rejected`);
}

function sha256(path: string): string {
  return createHash('sha256').update(readFileSync(path)).digest('hex');
}

describe('valid files normalize to the expected object', () => {
  it('compare claims: defaults filled in, paths resolved, confidence understood, places kept', async () => {
    const got = await readClaims(fx('valid-compare.yaml'));
    const expected: ClaimsFile = {
      path: fx('valid-compare.yaml'),
      sha256: sha256(fx('valid-compare.yaml')),
      title: 'Student voice 2026',
      organisation: "Tarnquill Students' Guild",
      description: 'National release, March 2026',
      dataDate: '2026-03-14',
      confidence: 0.95,
      confidenceWritten: '95%',
      adjust: 'holm',
      minRespondents: 10,
      sources: [
        {
          id: 'results',
          path: fx('data/summary.csv'),
          file: 'data/summary.csv',
          format: 'csv',
          shape: 'summary',
          respondents: 'Respondents',
          agree: 'Agreeing',
          questionColumn: 'question',
          agreeCodes: [4, 5],
          notApplicableCodes: [],
          place: { line: 8, column: 3 },
        },
      ],
      claims: [
        {
          id: 'feedback-below-region',
          statement: 'Our rate of agreement on feedback is below the rest of the region.',
          kind: 'compare',
          source: 'results',
          where: { year: 2026, question: 'Q09' },
          focus: { provider: 'Tarnquill College' },
          against: { region: 'Glimmerholt Vale' },
          focusLabel: 'Tarnquill',
          expect: 'lower',
          sided: 'one-sided',
          confidence: 0.95,
          confidenceWritten: '95%',
          minRespondents: 10,
          place: { line: 14, column: 5 },
        },
        {
          id: 'years-differ',
          statement: 'Agreement on feedback differs between 2025 and 2026.',
          kind: 'compare',
          source: 'results',
          where: {},
          focus: { year: 2026 },
          against: { year: [2025, '2024'] },
          expect: 'different',
          sided: 'two-sided',
          confidence: 0.99,
          confidenceWritten: '0.99',
          minRespondents: 10,
          place: { line: 23, column: 5 },
        },
      ],
    };
    expect(got).toEqual(expected);
  });

  it('association claims and respondent-level sources', async () => {
    const got = await readClaims(fx('valid-association.yaml'));
    expect(got.confidence).toBe(0.9);
    expect(got.confidenceWritten).toBe('90');
    expect(got.adjust).toBe('benjamini-hochberg');
    expect(got.minRespondents).toBe(5);
    expect(got.sources).toEqual([
      {
        id: 'people',
        path: fx('data/respondents.csv'),
        file: 'data/respondents.csv',
        format: 'csv',
        shape: 'respondents',
        questions: ['Q01', 'Q02'],
        questionColumn: 'question',
        agreeCodes: [5],
        notApplicableCodes: [9],
        place: { line: 7, column: 3 },
      },
      {
        id: 'totals',
        path: fx('data/summary.csv'),
        file: 'data/summary.csv',
        format: 'csv',
        shape: 'summary',
        respondents: 'Respondents',
        agreePercent: '% agree',
        population: 'Eligible',
        questionColumn: 'question',
        agreeCodes: [4, 5],
        notApplicableCodes: [],
        place: { line: 13, column: 3 },
      },
    ]);
    expect(got.claims).toEqual([
      {
        id: 'resources-go-with-overall',
        naming: { question: 'question' },
        statement: 'Departments whose students rate resources higher also rate the course higher overall.',
        kind: 'association',
        source: 'people',
        where: {},
        units: ['department'],
        x: { question: 'Q01' },
        y: { question: 'Q02' },
        xLabel: 'Resources',
        yLabel: 'Overall',
        xMeasure: { type: 'agree' },
        yMeasure: { type: 'agree' },
        controls: [],
        weighted: false,
        minRespondents: 5,
        expect: 'positive',
        sided: 'two-sided',
        confidence: 0.999,
        confidenceWritten: '99.9 %',
        place: { line: 20, column: 5 },
      },
    ]);
  });

  it('confidence written as the bare number 95 is read as 95%', async () => {
    const got = await readClaims(fx('confidence-95.yaml'));
    expect(got.confidence).toBe(0.95);
    expect(got.confidenceWritten).toBe('95');
    expect(got.claims[0]!.confidence).toBe(0.95);
  });
});

/** Each case: fixture, exact place, and phrases the message must contain. */
const cases: Array<{ name: string; file: string; line: number; column: number; field?: string; phrases: string[] }> = [
  {
    name: 'YAML syntax error (bad indent)',
    file: 'errors/syntax-indent.yaml',
    line: 6,
    column: 1,
    phrases: ['not indented in line', 'All mapping items must start at the same column', 'Fix: Line it up'],
  },
  {
    name: 'YAML syntax error (unclosed quote points at the opening quote)',
    file: 'errors/syntax-quote.yaml',
    line: 5,
    column: 24,
    phrases: ['double quote opened here is never closed', 'Add the closing "'],
  },
  {
    name: 'tab used for indenting',
    file: 'errors/tab.yaml',
    line: 2,
    column: 1,
    phrases: ['tab is used for indenting', 'spaces only'],
  },
  {
    name: 'key written twice',
    file: 'errors/dupkey.yaml',
    line: 2,
    column: 1,
    field: 'title',
    phrases: ['same key is written twice'],
  },
  {
    name: 'two YAML documents',
    file: 'errors/twodocs.yaml',
    line: 2,
    column: 1,
    phrases: ['more than one YAML document', 'delete the second ---'],
  },
  {
    name: 'unknown key with the closest allowed key suggested',
    file: 'errors/unknown-key.yaml',
    line: 16,
    column: 5,
    field: 'agaisnt_label',
    phrases: ['"agaisnt_label" is not a key warrant knows in claim "feedback-below-region"', 'Did you mean "against_label"?'],
  },
  {
    name: 'claim without its words',
    file: 'errors/missing-claim.yaml',
    line: 10,
    column: 5,
    field: 'claim',
    phrases: ['claim "feedback-below-region" has no "claim"', 'Add claim: followed by the claim in plain words'],
  },
  {
    name: 'confidence 1.5 rejected',
    file: 'errors/confidence-1.5.yaml',
    line: 3,
    column: 13,
    field: 'confidence',
    phrases: ['confidence level 1.5 is read as 1.5%', 'above 50% and at most 99.9%', '0.95, 95 or "95%"'],
  },
  {
    name: 'confidence 150 rejected',
    file: 'errors/confidence-150.yaml',
    line: 3,
    column: 13,
    field: 'confidence',
    phrases: ['150 is read as 150%', '0.95, 95 or "95%"'],
  },
  {
    name: 'duplicated id names both places',
    file: 'errors/duplicate-id.yaml',
    line: 16,
    column: 9,
    field: 'id',
    phrases: ['"feedback-below-region" is used twice', 'line 16', 'line 10, column 9'],
  },
  {
    name: 'unknown kind: another name for a kind names the kind meant',
    file: 'errors/unknown-kind.yaml',
    line: 12,
    column: 11,
    field: 'kind',
    phrases: ['"comparison" is not an allowed value of kind', "Did you mean compare (two selections' rates)? Write kind: compare"],
  },
  {
    name: 'missing data file, with the near-miss name in the folder',
    file: 'errors/missing-file.yaml',
    line: 5,
    column: 11,
    field: 'file',
    phrases: ['data file was not found', 'there is a "summary.csv" in that folder', 'relative to the folder of the claims file'],
  },
  {
    name: 'folder given as data file',
    file: 'errors/folder-file.yaml',
    line: 5,
    column: 11,
    field: 'file',
    phrases: ['is a folder, not a data file'],
  },
  {
    name: 'unsupported extension',
    file: 'errors/bad-extension.yaml',
    line: 5,
    column: 11,
    field: 'file',
    phrases: ['.csv and .xlsx', 'Save the spreadsheet as .xlsx'],
  },
  {
    name: 'one-sided test without a direction',
    file: 'errors/one-sided-different.yaml',
    line: 16,
    column: 11,
    field: 'test',
    phrases: ['one-sided test but expects "different"', 'Set expect to lower or higher'],
  },
  {
    name: 'alias bomb',
    file: 'errors/alias-bomb.yaml',
    line: 2,
    column: 8,
    phrases: ['expand to more than 1000 values'],
  },
  {
    name: 'empty file (comments only)',
    file: 'errors/empty.yaml',
    line: 1,
    column: 1,
    phrases: ['the claims file is empty', 'title, organisation, sources and claims'],
  },
  {
    name: 'not UTF-8',
    file: 'errors/latin1.yaml',
    line: 2,
    column: 24,
    phrases: ['not UTF-8 text', 'Save it again as UTF-8'],
  },
];

describe('each error names its line:column, what is wrong and a fix', () => {
  for (const c of cases) {
    it(c.name, async () => {
      const problems = await problemsOf(fx(c.file));
      expect(problems).toHaveLength(1);
      const p = problems[0]!;
      expect({ line: p.line, column: p.column }).toEqual({ line: c.line, column: c.column });
      if (c.field !== undefined) expect(p.field).toBe(c.field);
      const message = new InputError(problems).message;
      expect(message.startsWith(`claims.yaml:${c.line}:${c.column}: `)).toBe(true);
      for (const phrase of c.phrases) expect(message).toContain(phrase);
      expect(message).toMatch(/ Fix: [A-Z].*\.$/);
    });
  }
});

describe('all problems are reported at once, in file order', () => {
  it('a file with many mistakes', async () => {
    const problems = await problemsOf(fx('errors/many.yaml'));
    expect(problems.map((p) => `${p.line}:${p.column} ${p.field ?? ''}`)).toEqual([
      '3:13 confidence',
      '4:1 minRespondents',
      '12:11 file',
      '16:5 agree',
      '16:11 file',
      '27:24 region',
      '28:13 expect',
      '29:5 claim',
      '29:9 id',
      '31:13 source',
      '35:9 id',
      '37:11 kind',
      '47:11 test',
      '48:5 focus',
      '50:5 source',
    ]);
    const byField = (line: number): string => new InputError(problems.filter((p) => p.line === line)).message;
    expect(byField(4)).toContain('Did you mean "min_respondents"?');
    expect(byField(16)).toContain('gives both agree and agree_percent');
    expect(byField(27)).toContain('put true/false or dates in quotes');
    expect(byField(28)).toContain('Did you mean higher? Write expect: higher (one of: lower, higher, different)');
    expect(byField(31)).toContain('Did you mean "results"?');
    expect(byField(35)).toContain('Write it as corr-one');
    expect(byField(48)).toContain('it belongs with kind: compare');
    expect(byField(50)).toContain('does not say which source it uses, and there are 3');
  });
});

describe('files that are not claims files', () => {
  it('oversized file is refused before it is parsed', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'warrant-claims-'));
    const big = join(dir, 'big.yaml');
    writeFileSync(big, '# ' + 'x'.repeat(MAX_CLAIMS_BYTES) + '\n');
    const problems = await problemsOf(big);
    expect(problems).toHaveLength(1);
    expect(problems[0]!.line).toBeUndefined();
    const message = new InputError(problems).message;
    expect(message).toContain('larger than 1 MB');
    expect(message).toContain(`found "${MAX_CLAIMS_BYTES + 3} bytes"`);
  });

  it('missing claims file and folder as claims file', async () => {
    const missing = await problemsOf(fx('no-such-claims.yaml'));
    expect(missing[0]!.problem).toBe('the claims file was not found');
    const folder = await problemsOf(fx('data'));
    expect(folder[0]!.problem).toBe('this is a folder, not a claims file');
  });
});
