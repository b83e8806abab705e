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
import { fsFailure, makeFolders, writeWhole } from '../../src/files.js';

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
