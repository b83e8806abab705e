/**
 * `warrant build` command lines read without yargs (quickBuildArgs in src/cli.ts) must come to the same build as
 * yargs's own reading of them (yargs 18 with warrant's declarations is the reference). The pipeline is replaced by a
 * stand-in that records the options it was given and returns a made-up pack, so each reading's build options, exit
 * code and printed words can be compared without building a pack.
 */
import { describe, expect, it, vi } from 'vitest';

const seen: unknown[] = [];

vi.mock('../../src/pipeline.js', () => ({
  displayPath: (p: string) => p,
  build: async (options: Record<string, unknown>) => {
    seen.push({ ...options, progress: typeof options.progress });
    return {
      decisions: [{ verdict: 'supported' }, { verdict: 'not-supported' }],
      results: { fingerprint: '0123456789ab', claims: [{ id: 'a', verdict: 'supported', p: 0.01, pAdjusted: 0.02 }] },
      files: { folder: 'out/claims/2026-01-01-0123456789ab', pdf: 'out/pack.pdf', results: 'out/results.json', reused: false },
    };
  },
}));

const { main, quickBuildArgs } = await import('../../src/cli.js');

async function run(argv: string[], quick: boolean): Promise<{ code: number; out: string; err: string; built: unknown[] }> {
  seen.length = 0;
  let out = '';
  let err = '';
  const o = vi.spyOn(process.stdout, 'write').mockImplementation((s) => ((out += String(s)), true));
  const e = vi.spyOn(process.stderr, 'write').mockImplementation((s) => ((err += String(s)), true));
  const exit = vi.spyOn(process, 'exit').mockImplementation(((c?: number) => {
    throw new Error(`exit ${c}`);
  }) as never);
  try {
    const code = await main([...argv], { quick }).catch((x: Error) => `threw ${x.message}`);
    // Under --debug the stack trace follows the message; its frames differ by reading and are left out.
    return { code: code as number, out, err: err.replace(/^\s+at .*\n?/gm, ''), built: [...seen] };
  } finally {
    o.mockRestore();
    e.mockRestore();
    exit.mockRestore();
  }
}

/** Command lines the quick reading takes. */
const TAKEN = [
  ['build', 'claims.yaml'],
  ['build', 'claims.yaml', '--out', 'out/x', '--quiet'],
  ['build', '--out', 'out/x', 'claims.yaml'],
  ['build', 'claims.yaml', '--out=out/x', '--date=2026-06-30', '--json'],
  ['build', 'claims.yaml', '--date', '2026', '--templates', 'my words', '--since', 'out/claims/2026-01-01-0123456789ab'],
  ['build', '123', '--out', '0x10'],
  ['build', 'claims.yaml', '--out', 'true'],
  ['build', 'claims.yaml', '--debug'],
  ['build', '--quiet', 'claims.yaml', '--json'],
  ['build', 'claims.yaml', '--out=a=b'],
  ['build', 'a b/claims file.yaml', '--out', 'ŵŷ Łą/out'],
];

/** Command lines left to yargs, for the record of what each reading does with them. */
const LEFT = [
  ['build'],
  ['build', 'a.yaml', 'b.yaml'],
  ['build', 'claims.yaml', '--help'],
  ['build', 'claims.yaml', '-h'],
  ['build', 'claims.yaml', '--out'],
  ['build', 'claims.yaml', '--out', '--quiet'],
  ['build', 'claims.yaml', '--out='],
  ['build', 'claims.yaml', '--out', 'a', '--out', 'b'],
  ['build', 'claims.yaml', '--quiet', 'true'],
  ['build', 'claims.yaml', '--quiet', 'false'],
  ['build', 'claims.yaml', '--quiet=false'],
  ['build', 'claims.yaml', '--no-quiet'],
  ['build', 'claims.yaml', '--data', 'results=x.csv'],
  ['build', 'claims.yaml', '--templtes', 'x'],
  ['build', 'claims.yaml', '--', '--out'],
  ['build', 'claims.yaml', '-q'],
  ['build', ''],
  ['check', 'claims.yaml'],
  ['--version'],
];

describe('reading warrant build command lines without yargs', () => {
  it.each(TAKEN)('takes %j and builds with the options yargs reads from it', async (...argv) => {
    expect(quickBuildArgs(argv)).toBeDefined();
    const quick = await run(argv, true);
    const full = await run(argv, false);
    expect(quick.built).toHaveLength(1);
    expect(quick.code).toBe(0);
    expect(quick).toEqual(full);
  });

  it.each(LEFT)('leaves %j to yargs', async (...argv) => {
    expect(quickBuildArgs(argv)).toBeUndefined();
  });
});
