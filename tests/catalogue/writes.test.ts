/**
 * The two helpers every writer uses (src/files.ts): makeFolders, which must stop where Node's recursive mkdir would
 * retry for ever (a folder such as /proc/self that exists yet answers ENOENT to a new folder in it), and writeWhole,
 * which writes a file whole or not at all and never over an existing file unless asked. Rules of this project, not
 * of an outside reference (common practice).
 */
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { fsFailure, makeFolders, writeFailure, writeWhole } from '../../src/files.js';

const dir = mkdtempSync(join(tmpdir(), 'warrant-writes-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('makeFolders', () => {
  it('makes every missing folder of a path', () => {
    makeFolders(join(dir, 'a', 'b', 'c'));
    expect(readdirSync(join(dir, 'a', 'b'))).toEqual(['c']);
    makeFolders(join(dir, 'a', 'b', 'c')); // already there: nothing to do
  });

  it('stops with its own error in a folder that exists yet refuses new folders (/proc/self), where mkdir -p loops', () => {
    const started = performance.now();
    let thrown: unknown;
    try {
      makeFolders('/proc/self/warrant-test/inner');
    } catch (e) {
      thrown = e;
    }
    expect(performance.now() - started).toBeLessThan(1000);
    expect((thrown as { code?: string }).code).toBe('WARRANT_NO_NEW_FOLDERS');
    expect(fsFailure(thrown, { file: 'x' }, 'writing')?.problems[0]?.problem).toBe('writing failed: the folder above it takes no new folders or files (a system folder such as /proc or /sys)');
  });

  it('refuses a path through a file (ENOTDIR)', () => {
    writeFileSync(join(dir, 'plain'), 'x');
    expect(() => makeFolders(join(dir, 'plain', 'inside'))).toThrow(expect.objectContaining({ code: 'ENOTDIR' }));
  });
});

describe('writeWhole', () => {
  it('never writes over an existing file unless asked, and leaves no temporary file', () => {
    const f = join(dir, 'kept.yaml');
    writeFileSync(f, 'first');
    expect(() => writeWhole(f, 'second', { replace: false })).toThrow(expect.objectContaining({ code: 'EEXIST' }));
    expect(readFileSync(f, 'utf8')).toBe('first');
    writeWhole(f, 'third', { replace: true });
    expect(readFileSync(f, 'utf8')).toBe('third');
    writeWhole(join(dir, 'new.yaml'), 'fresh', { replace: false });
    expect(readFileSync(join(dir, 'new.yaml'), 'utf8')).toBe('fresh');
    expect(readdirSync(dir).filter((n) => n.endsWith('.partial'))).toEqual([]);
  });

  it('says a folder that takes no new files in its own words, and leaves the target as it was', () => {
    expect(() => writeWhole('/proc/self/warrant-test.yaml', 'x', { replace: true })).toThrow(expect.objectContaining({ code: 'WARRANT_NO_NEW_FOLDERS' }));
    expect(existsSync('/proc/self/warrant-test.yaml')).toBe(false);
  });
});

describe('writeFailure', () => {
  // The errors as Node throws them for a file that cannot be opened for writing (tests run as root, for whom
  // permissions are not enforced, so they are made here with the fields Node gives them).
  const failed = (code: string, path: string, syscall = 'open'): Error => Object.assign(new Error(`${code}: ${syscall} '${path}'`), { code, path, syscall });

  it('says a folder that cannot be written as a write, naming the folder, with a write’s fixes', () => {
    const e = writeFailure(failed('EACCES', '/srv/shared/claims.yaml.123.partial'), { file: 'claims.yaml' }, 'writing the demo file', '/srv/shared', 'give warrant demo another folder');
    expect(e?.problems[0]?.problem).toBe('writing the demo file failed: the folder /srv/shared cannot be written: permission was denied');
    expect(e?.problems[0]?.fix).toBe('Give warrant demo another folder, or change the permissions of /srv/shared so that you can write in it (e.g. chmod u+w /srv/shared)');
    expect(e?.problems[0]?.fix).not.toMatch(/copy the file|read/);
  });

  it('names the folder itself when its access was checked, and the folder the file was in otherwise', () => {
    const checked = writeFailure(failed('EROFS', '/mnt/cd/packs', 'access'), { file: 'packs' }, 'writing the pack', '/elsewhere', 'give --out another folder');
    expect(checked?.problems[0]?.problem).toBe('writing the pack failed: the folder /mnt/cd/packs cannot be written: it is on a read-only file system');
    const opened = writeFailure(failed('ENOSPC', '/data/out/results.json'), { file: 'out' }, 'writing the pack', '/elsewhere', 'give --out another folder');
    expect(opened?.problems[0]?.problem).toBe('writing the pack failed: the folder /data/out cannot be written: there is no space left on its disk');
    expect(opened?.problems[0]?.fix).toBe('Free some space on the disk and run the command again, or give --out another folder on another disk');
  });

  it('says a folder where a file is written as such, without the temporary name', () => {
    const e = Object.assign(new Error("EISDIR: rename '/w/claims.seal.json.9.partial' -> '/w/claims.seal.json'"), { code: 'EISDIR', path: '/w/claims.seal.json.9.partial', dest: '/w/claims.seal.json', syscall: 'rename' });
    expect(writeFailure(e, { file: 'x' }, 'writing the seal', '/w', 'seal elsewhere')?.problems[0]?.problem).toBe('writing the seal failed: /w/claims.seal.json is a folder, where warrant writes a file');
  });

  it('leaves errors that are not the file system’s to the caller', () => {
    expect(writeFailure(new Error('something else'), { file: 'x' }, 'writing', '/w', 'elsewhere')).toBeUndefined();
  });
});
