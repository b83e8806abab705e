/**
 * warrant demo: the shipped demo copied into a folder of the user's choice. The copy must be the demo byte for byte
 * (its claims file differs only in the schema line, which must point at a schema that exists), pass `warrant check`
 * from its new folder, and never replace a file without --force. (Building the copy is covered from an installed
 * package in tests/e2e/installed.test.ts.)
 */
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { nextSteps, writeDemo } from '../../src/commands/demo.js';
import { checkClaimsFile } from '../../src/commands/check.js';

const root = resolve(dirname(fileURLToPath(import.meta.url)), '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-demo-cmd-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** The data files under demo/data, relative to demo/, in name order: listed here independently of the command. */
function shippedData(): string[] {
  const out: string[] = [];
  for (const release of readdirSync(join(root, 'demo/data')).sort()) {
    for (const name of readdirSync(join(root, 'demo/data', release)).sort()) out.push(`data/${release}/${name}`);
  }
  return out;
}

function quietly(): { write: (t: string) => void; said: () => string } {
  let text = '';
  return { write: (t) => (text += t), said: () => text };
}

describe('warrant demo', () => {
  it('copies the claims file and every data file, and the copy passes check from its new folder', async () => {
    const folder = join(work, 'fresh', 'nested');
    const out = quietly();
    const written = await writeDemo({ folder, write: out.write });
    expect(written.files).toEqual(['claims.yaml', ...shippedData()]);
    expect(written.replaced).toEqual([]);
    expect(written.history).toBe(join(folder, 'out', 'claims'));
    for (const f of shippedData()) expect(readFileSync(join(folder, f)).equals(readFileSync(join(root, 'demo', f))), f).toBe(true);

    const original = readFileSync(join(root, 'demo/claims.yaml'), 'utf8').split('\n');
    const copy = readFileSync(written.claims, 'utf8').split('\n');
    expect(copy.length).toBe(original.length);
    expect(copy.slice(1)).toEqual(original.slice(1));
    const schema = /^# yaml-language-server: \$schema=(.+)$/.exec(copy[0]!)?.[1];
    expect(schema).toBeDefined();
    expect(resolve(folder, schema!)).toBe(join(root, 'schema/claims.schema.json'));

    const report = await checkClaimsFile(written.claims);
    expect(report.problems).toEqual([]);
    expect(report.claims).toBe(original.filter((l) => /^ {2}- id: /.test(l)).length);
    expect(out.said()).toContain(`claims.yaml (the claims of an invented students' union) and ${shippedData().length} data files`);
  });

  it('refuses to replace files without --force and writes nothing; with --force replaces them and says which', async () => {
    const folder = join(work, 'taken');
    mkdirSync(join(folder, 'data', '2026'), { recursive: true });
    writeFileSync(join(folder, 'claims.yaml'), 'my own claims\n');
    writeFileSync(join(folder, 'notes.txt'), 'keep me\n');
    const attempt = writeDemo({ folder, write: () => {} });
    await expect(attempt).rejects.toBeInstanceOf(InputError);
    await expect(attempt).rejects.toThrow(/already in the folder, and warrant demo does not overwrite files unless asked.*found "claims\.yaml".*Fix: .*--force/s);
    expect(readFileSync(join(folder, 'claims.yaml'), 'utf8')).toBe('my own claims\n');
    expect(readdirSync(join(folder, 'data', '2026'))).toEqual([]);

    const out = quietly();
    const written = await writeDemo({ folder, force: true, write: out.write });
    expect(written.replaced).toEqual(['claims.yaml']);
    expect(out.said()).toContain('Replaced (--force): claims.yaml.');
    expect(readFileSync(join(folder, 'claims.yaml'), 'utf8')).toContain('organisation: Quarrendell Union of Students');
    expect(readFileSync(join(folder, 'notes.txt'), 'utf8')).toBe('keep me\n');
    expect(readdirSync(folder).filter((n) => n.endsWith('.partial'))).toEqual([]);
  });

  it('refuses a path that is a file, and a folder standing where a file goes', async () => {
    const file = join(work, 'a-file.txt');
    writeFileSync(file, 'x');
    await expect(writeDemo({ folder: file, write: () => {} })).rejects.toThrow(/this is a file, and warrant demo writes into a folder/);
    const folder = join(work, 'blocked');
    mkdirSync(join(folder, 'claims.yaml'), { recursive: true });
    await expect(writeDemo({ folder, write: () => {} })).rejects.toThrow(/a folder of that name is in the way/);
    expect(existsSync(join(folder, 'data'))).toBe(false);
  });

  it('says the next command to run, from the folder the user is in', async () => {
    const written = await writeDemo({ folder: join(work, 'steps folder'), write: () => {} });
    const built = nextSteps(written, true);
    expect(built).toContain('npx warrant build claims.yaml');
    expect(built).toContain(`cd '${written.folder}' && `);
    expect(nextSteps(written, false)).toContain('out/claims/latest/pack.pdf');
  });
});
