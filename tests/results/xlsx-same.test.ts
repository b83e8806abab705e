/**
 * warrant's own results.xlsx writer against the exceljs 4.4 writer it replaced (tests/results/xlsx-reference.ts, the
 * reference): the same entries in the same order, each entry's unzipped part byte for byte the same, with the same
 * zip header fields apart from the compressed sizes (the parts are deflated by Node's zlib rather than by the
 * JavaScript deflate under exceljs). Checked on made-up results drawn by fast-check, including text with markup
 * characters, control characters, leading spaces, line breaks and formula-like starts, and numbers of every size.
 */
import { inflateRawSync } from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { crc32, tableCrc32, writeResultsXlsx } from '../../src/results/xlsx.js';
import type { ClaimResult, ResultsFile } from '../../src/results/results.js';
import { writeResultsXlsxWithExceljs } from './xlsx-reference.js';

interface Entry {
  name: string;
  method: number;
  versionNeeded: number;
  madeBy: number;
  flags: number;
  time: number;
  date: number;
  crc: number;
  size: number;
  external: number;
  body: Buffer;
}

/** The entries of a zip file, read from its central directory (PKWARE APPNOTE.TXT 4.3.12, 4.3.16). */
function unzip(zip: Buffer): Entry[] {
  const eocd = zip.lastIndexOf(Buffer.from([0x50, 0x4b, 0x05, 0x06]));
  const count = zip.readUInt16LE(eocd + 10);
  let at = zip.readUInt32LE(eocd + 16);
  const out: Entry[] = [];
  for (let i = 0; i < count; i++) {
    const nameLength = zip.readUInt16LE(at + 28);
    const local = zip.readUInt32LE(at + 42);
    const method = zip.readUInt16LE(at + 10);
    const compressed = zip.readUInt32LE(at + 20);
    const start = local + 30 + zip.readUInt16LE(local + 26) + zip.readUInt16LE(local + 28);
    const raw = zip.subarray(start, start + compressed);
    out.push({
      name: zip.toString('utf8', at + 46, at + 46 + nameLength),
      madeBy: zip.readUInt16LE(at + 4),
      versionNeeded: zip.readUInt16LE(at + 6),
      flags: zip.readUInt16LE(at + 8),
      method,
      time: zip.readUInt16LE(at + 12),
      date: zip.readUInt16LE(at + 14),
      crc: zip.readUInt32LE(at + 16),
      size: zip.readUInt32LE(at + 24),
      external: zip.readUInt32LE(at + 38),
      body: method === 8 ? inflateRawSync(raw) : Buffer.from(raw),
    });
    // The local header repeats the central one.
    expect(zip.readUInt32LE(local)).toBe(0x04034b50);
    expect(zip.readUInt32LE(local + 14)).toBe(zip.readUInt32LE(at + 16));
    at += 46 + nameLength + zip.readUInt16LE(at + 30) + zip.readUInt16LE(at + 32);
  }
  return out;
}

async function expectSameWorkbook(results: ResultsFile): Promise<void> {
  const ours = unzip(await writeResultsXlsx(results));
  const reference = unzip(await writeResultsXlsxWithExceljs(results));
  expect(ours.map((e) => e.name)).toEqual(reference.map((e) => e.name));
  ours.forEach((e, i) => {
    const r = reference[i]!;
    expect({ ...e, body: e.body.toString('utf8') }, e.name).toEqual({ ...r, body: r.body.toString('utf8') });
    expect(crc32(e.body)).toBe(e.crc);
    expect(tableCrc32(e.body)).toBe(e.crc);
  });
}

const interval = (lower: number, upper: number) => ({ lower, upper, level: 0.95, method: 'wilson' });

function claim(over: Partial<ClaimResult>): ClaimResult {
  return {
    id: 'a-claim',
    statement: 'A claim.',
    kind: 'compare',
    method: 'two-proportion-z',
    methods: ['two-proportion-z'],
    hypotheses: { null: 'equal', alternative: 'lower' },
    confidence: 0.95,
    sided: 'two-sided',
    expect: 'lower',
    verdict: 'supported',
    verdictText: 'Supported.',
    estimate: { name: 'difference in proportions', value: -0.1 },
    interval: interval(-0.2, -0.05),
    statistic: { symbol: 'z', value: -3 },
    df: null,
    p: 0.001,
    pAdjusted: 0.002,
    n: [120, 340],
    selections: [],
    units: [],
    detectable: 0.05,
    comparedWithRest: false,
    cautions: [],
    ...over,
  } as ClaimResult;
}

function resultsWith(claims: ClaimResult[], over: Partial<ResultsFile> = {}): ResultsFile {
  return {
    format: 1,
    tool: { name: 'warrant', version: '0.1.0' },
    title: 'Student voice review 2026',
    organisation: 'Coleg Ŵennalt',
    date: '2026-03-03',
    claimsFile: { file: 'claims.yaml', sha256: 'ab'.repeat(32) },
    settings: { confidence: 0.95, adjust: 'holm', minRespondents: 10 },
    sources: [],
    claims,
    ...over,
  } as ResultsFile;
}

const text = fc.oneof(
  fc.string({ maxLength: 30 }),
  fc.string({ unit: fc.constantFrom('a', ' ', '\n', '\t', '\r', '&', '<', '>', '"', "'", '=', '+', '-', '@', '\u0001', '\u000b', '\u007f', 'ŵ', '😀'), maxLength: 12 }),
);
const num = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer(), fc.constantFrom(0, -0, 1e-300, 123456789012, 0.1 + 0.2));
const maybe = <T>(a: fc.Arbitrary<T>) => fc.option(a, { nil: null });

const arbSelection = fc.record({
  label: text,
  n: fc.nat(100000),
  agree: fc.nat(100000),
  rate: num,
  interval: fc.record({ lower: num, upper: num, level: fc.constantFrom(0.9, 0.95, 0.99), method: fc.constant('wilson') }),
  population: fc.option(fc.nat(100000), { nil: undefined }),
  approximate: fc.boolean(),
});

const arbClaim = fc
  .record({
    id: text,
    statement: text,
    kind: fc.constantFrom('compare', 'association', 'trend'),
    verdict: fc.constantFrom('supported', 'not-supported', 'too-little-data'),
    verdictLabel: fc.option(fc.oneof(text, fc.constantFrom('Not supported: inconclusive', 'Supported')), { nil: undefined }),
    advice: fc.option(fc.record({ action: fc.constant('reword'), label: text, reason: text, wording: fc.option(text, { nil: undefined }) }), { nil: undefined }),
    estimate: maybe(fc.record({ name: fc.constantFrom('difference in proportions', 'Pearson r', 'rate ratio', 'odds'), value: num })),
    interval: maybe(fc.record({ lower: num, upper: num, level: fc.constantFrom(0.9, 0.95), method: fc.constant('x') })),
    confidence: fc.constantFrom(0.9, 0.95, 0.99),
    p: maybe(num),
    pAdjusted: maybe(num),
    n: fc.array(fc.nat(10_000_000), { maxLength: 3 }),
    cautions: fc.array(text, { maxLength: 3 }),
    selections: fc.array(arbSelection, { maxLength: 3 }),
  })
  .map((c) => claim(c as Partial<ClaimResult>));

describe('results.xlsx written by warrant, against exceljs', () => {
  it('gives the same parts for a small pack', async () => {
    await expectSameWorkbook(
      resultsWith([
        claim({ statement: '=HYPERLINK("x") & <b>', cautions: ['-1 point is small.', ' leading space', 'two\nlines'], selections: [{ label: '+rest', n: 10, agree: 5, rate: 0.5, interval: interval(0.2, 0.8), population: 40, approximate: true }] }),
        claim({ id: 'r', kind: 'association', estimate: { name: 'Pearson r', value: 0.88 }, n: [12], p: 1.3e-4 }),
        claim({ id: 'none', estimate: null, interval: null, p: null, pAdjusted: null, n: [], verdict: 'too-little-data' }),
        claim({ id: 'split', verdict: 'not-supported', verdictLabel: 'Not supported: ruled out', advice: { action: 'reword', label: 'Reword', reason: 'Why.', wording: '=say this' } }),
      ]),
    );
  });

  it('gives the same parts with no selections at all, and with no claim measuring a proportion', async () => {
    await expectSameWorkbook(resultsWith([claim({ estimate: { name: 'Pearson r', value: 0.3 }, selections: [] })], { title: '', organisation: '', date: 'spring' }));
    await expectSameWorkbook(resultsWith([claim({ estimate: null, interval: null, p: null, pAdjusted: null, n: [], confidence: 0.9 })]));
  });

  it('computes CRC-32 check values as published', () => {
    // The CRC-32 check value of the ASCII digits 123456789 is CBF43926 (the standard check of the zip/PNG CRC;
    // from memory, and the same as Node's zlib.crc32 where present).
    expect(tableCrc32(Buffer.from('123456789')).toString(16)).toBe('cbf43926');
    expect(crc32(Buffer.from('123456789')).toString(16)).toBe('cbf43926');
    expect(tableCrc32(new Uint8Array(0))).toBe(0);
  });

  it('gives the same parts for any results', async () => {
    await fc.assert(
      fc.asyncProperty(fc.array(arbClaim, { minLength: 1, maxLength: 5 }), text, text, async (claims, title, organisation) => {
        await expectSameWorkbook(resultsWith(claims, { title, organisation }));
      }),
      { numRuns: 60 },
    );
  });
});
