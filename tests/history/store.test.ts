/**
 * Pack history on disk: a new folder per build, a latest link, and no harm to earlier packs when a build fails or is
 * killed part-way (common practice for safe writes: write to a temporary folder, then rename).
 */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { build } from '../../src/pipeline.js';

const root = resolve(__dirname, '../..');
const work = mkdtempSync(join(tmpdir(), 'warrant-history-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

/** A copy of the demo whose summary workbook can be swapped for a different (corrected) one. */
function demoCopy(name: string): string {
  const dir = join(work, name);
  cpSync(join(root, 'demo'), dir, { recursive: true });
  return dir;
}

const snapshot = (dir: string) =>
  Object.fromEntries(
    readdirSync(dir, { recursive: true, withFileTypes: true })
      .filter((e) => e.isFile())
      .map((e) => [join(e.parentPath, e.name), readFileSync(join(e.parentPath, e.name)).toString('base64')]),
  );

describe('pack history', () => {
  it('adds a pack folder per distinct build and points latest at the newest; identical inputs reuse their folder', async () => {
    const demo = demoCopy('a');
    const out = join(work, 'a-out');
    const first = await build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo, now: new Date('2026-03-04T10:00:00Z') });
    expect(first.files.folder).toMatch(/2026-03-04-[0-9a-f]{12}$/);
    expect(readlinkSync(join(out, 'latest'))).toBe(first.files.folder.split('/').pop());
    const again = await build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo, now: new Date('2026-03-04T11:00:00Z') });
    expect(again.files.reused).toBe(true);
    expect(again.diff).toBeUndefined();
    // A different date option changes the pack, so it gets a folder of its own and a change section.
    const third = await build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo, date: '2026-03-05', now: new Date('2026-03-05T09:00:00Z') });
    expect(third.files.folder).not.toBe(first.files.folder);
    expect(readdirSync(out).filter((n) => /^\d{4}/.test(n))).toHaveLength(2);
    expect(third.diff?.verdicts).toEqual([]);
    expect(third.model.changes?.heading).toBe('What changed since 3 March 2026');
    expect(readlinkSync(join(out, 'latest'))).toBe(third.files.folder.split('/').pop());
  });

  it('marks a claim edited after an earlier pack showed its results, and only that claim', async () => {
    const demo = demoCopy('edit');
    const out = join(work, 'edit-out');
    await build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo, now: new Date('2026-03-04T10:00:00Z') });
    const claimsFile = join(demo, 'claims.yaml');
    const text = readFileSync(claimsFile, 'utf8');
    // Weaken the claim after seeing it supported: from "less likely" to "no more likely".
    writeFileSync(claimsFile, text.replace('Our students are less likely than students elsewhere', 'Our students are no more likely than students elsewhere'));
    const after = await build({ claimsPath: claimsFile, outDir: out, cwd: demo, now: new Date('2026-03-05T10:00:00Z') });
    expect(after.diff?.edited).toEqual(['feedback-below-region']);
    const noticed = after.model.claims.filter((c) => (c.notices ?? []).some((n) => n.includes('changed after an earlier pack (built 4 March 2026)')));
    expect(noticed.map((c) => c.id)).toEqual(['feedback-below-region']);
    expect(after.model.changes?.notes).toContain(
      'Claim feedback-below-region was edited: its words, selections, direction, confidence or thresholds differ from before.',
    );
  });

  it('leaves earlier packs and the latest link untouched when writing fails part-way', async () => {
    const demo = demoCopy('b');
    const out = join(work, 'b-out');
    await build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo });
    const before = snapshot(out);
    const link = readlinkSync(join(out, 'latest'));
    await expect(
      build({ claimsPath: join(demo, 'claims.yaml'), outDir: out, cwd: demo, date: '2026-04-01', hooks: { failAfterFiles: 1 } }),
    ).rejects.toThrow(/interrupted on purpose/);
    expect(snapshot(out)).toEqual(before);
    expect(readlinkSync(join(out, 'latest'))).toBe(link);
    expect(readdirSync(out).filter((n) => n.startsWith('.'))).toEqual([]);
  });

  it('survives a build killed outright while writing: earlier pack intact, leftovers swept by the next build', () => {
    const demo = demoCopy('c');
    const out = join(work, 'c-out');
    const bin = join(root, 'bin/warrant.js');
    const ok = spawnSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', out, '--quiet'], { cwd: demo, encoding: 'utf8' });
    expect(ok.status).toBe(0);
    const before = snapshot(out);
    const link = readlinkSync(join(out, 'latest'));
    const killed = spawnSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', out, '--date', '2026-05-01'], {
      cwd: demo,
      encoding: 'utf8',
      env: { ...process.env, WARRANT_TEST_KILL_AFTER_FILES: '1' },
    });
    expect(killed.signal).toBe('SIGKILL');
    // The killed build left its temporary folder, but no pack folder and no change to latest.
    const leftovers = readdirSync(out).filter((n) => n.startsWith('.building-'));
    expect(leftovers).toHaveLength(1);
    expect(readlinkSync(join(out, 'latest'))).toBe(link);
    for (const [file, content] of Object.entries(before)) expect(readFileSync(file).toString('base64')).toBe(content);
    const next = spawnSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', out, '--quiet', '--date', '2026-05-01'], { cwd: demo, encoding: 'utf8' });
    expect(next.status).toBe(0);
    expect(readdirSync(out).filter((n) => n.startsWith('.'))).toEqual([]);
  });
});
