/**
 * Where packs live. Each claims file has a history folder (default out/<claims file name>/); every build writes a
 * new pack folder inside it, named by the build day and the pack's fingerprint, and never touches earlier ones.
 * A `latest` link names the newest. A pack is written into a temporary folder and renamed into place, so an
 * interrupted build leaves the earlier packs intact and no half-written pack behind.
 */
import { closeSync, existsSync, fstatSync, lstatSync, openSync, readdirSync, readlinkSync, readSync, realpathSync, rmdirSync, statSync, writeFileSync, writevSync } from 'node:fs';
import { readlink, rename, rm, symlink } from 'node:fs/promises';
import { basename, dirname, join, relative } from 'node:path';
import type { ResultsFile } from '../results/results.js';
import { InputError } from '../errors.js';
import { fsReason, makeFolders, otherThanFile, readOrdinaryFile, writeFailure } from '../files.js';

export const LATEST = 'latest';
const TEMP_PREFIX = '.building-';

/** A path as the user knows it: anything inside a pack's temporary folder is said as the history folder `root`. */
export function outsideTemporary(abs: string, root: string): string {
  const rel = relative(root, abs);
  return rel.startsWith(TEMP_PREFIX) ? root : abs;
}
const FOLDER = /^\d{4}-\d{2}-\d{2}-[0-9a-f]{12}$/;

export interface StoredPack {
  /** Folder name inside the history folder, e.g. 2026-03-04-1a2b3c4d5e6f. */
  name: string;
  path: string;
  results: ResultsFile;
}

/** Folder name for a pack built on `day` (YYYY-MM-DD) with this fingerprint. */
export function packFolderName(day: string, fingerprint: string): string {
  return `${day}-${fingerprint}`;
}

/** Today's date in UTC as YYYY-MM-DD (used only to name folders, never inside a pack). */
export function today(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** An earlier pack whose results.json is there but cannot be read, and why (said in the new pack and on the terminal). */
export interface UnreadablePack {
  name: string;
  path: string;
  reason: string;
}

/** results.json of a pack is a few megabytes at most; anything beyond this is not one. */
const MAX_RESULTS_BYTES = 256 * 1024 * 1024;

/** The parts of results.json that comparing two packs relies on; a file without them is not a readable pack. */
function resultsShapeProblem(x: unknown): string | undefined {
  const isObj = (v: unknown): v is Record<string, unknown> => v !== null && typeof v === 'object' && !Array.isArray(v);
  if (!isObj(x)) return 'it does not hold a JSON object';
  const listOfIds = (v: unknown): boolean => Array.isArray(v) && v.every((c) => isObj(c) && typeof c.id === 'string');
  if (!listOfIds(x.claims)) return 'its list of claims is missing or damaged';
  if (!listOfIds(x.sources)) return 'its list of sources is missing or damaged';
  if (!isObj(x.settings) || !isObj(x.claimsFile) || typeof x.date !== 'string' || typeof x.fingerprint !== 'string') return 'its settings, claims file, date or fingerprint are missing';
  return undefined;
}

/** A pack folder's results.json: the results, the reason it cannot be read, or nothing when there is none. */
export function readResultsOf(folder: string): { results: ResultsFile } | { unreadable: string } | undefined {
  const file = join(folder, 'results.json');
  if (!existsSync(file)) return undefined;
  let text: string;
  try {
    text = readOrdinaryFile(file, MAX_RESULTS_BYTES, { file }, 'results.json of an earlier pack', (size) => new InputError({ file, found: size, problem: 'results.json is far larger than any pack writes', fix: 'Remove the file' })).toString('utf8');
  } catch (e) {
    return { unreadable: e instanceof InputError ? (e.problems[0]?.problem ?? e.message) : fsReason(e) ?? String(e) };
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    return { unreadable: `its results.json is cut short or damaged (${(e as Error).message})` };
  }
  const shape = resultsShapeProblem(parsed);
  return shape !== undefined ? { unreadable: `its results.json is not one warrant can compare with: ${shape}` } : { results: parsed as ResultsFile };
}

function readResults(folder: string): ResultsFile | undefined {
  const r = readResultsOf(folder);
  return r !== undefined && 'results' in r ? r.results : undefined;
}

/** Every complete pack in a history folder, oldest first (by folder name: build day, then fingerprint). */
export function listPacks(root: string): StoredPack[] {
  if (!existsSync(root)) return [];
  return readdirSync(root)
    .filter((name) => FOLDER.test(name) && statSync(join(root, name)).isDirectory())
    .sort()
    .flatMap((name) => {
      const results = readResults(join(root, name));
      return results ? [{ name, path: join(root, name), results }] : [];
    });
}

/** The pack the `latest` link names, if any. */
export function latestPack(root: string): StoredPack | undefined {
  const r = latestOrUnreadable(root);
  return r !== undefined && 'results' in r ? r : undefined;
}

/** The pack the `latest` link names; or, when its results.json is damaged, which pack that is and why. */
export function latestOrUnreadable(root: string): StoredPack | UnreadablePack | undefined {
  const link = join(root, LATEST);
  let name: string;
  try {
    name = basename(readlinkSync(link));
  } catch {
    return undefined;
  }
  const r = readResultsOf(join(root, name));
  if (r === undefined) return undefined;
  return 'results' in r ? { name, path: join(root, name), results: r.results } : { name, path: join(root, name), reason: r.unreadable };
}

/** A pack folder given on the command line: a pack folder, its results.json, or a history folder (its latest). */
export function openPack(path: string, shown: string = path): StoredPack | undefined {
  const given = path.endsWith('.json') ? join(path, '..') : path;
  // The `latest` link (or any link) is followed, so the pack is named by its real folder.
  let folder = given;
  try {
    folder = realpathSync(given);
  } catch {
    return undefined;
  }
  const direct = readResultsOf(folder);
  if (direct !== undefined) {
    if ('results' in direct) return { name: basename(folder), path: folder, results: direct.results };
    throw new InputError({ file: shown, problem: `the pack ${basename(folder)} cannot be read: ${direct.unreadable}`, fix: 'Name another pack, or build this one again from its claims file and data' });
  }
  const latest = latestOrUnreadable(folder);
  if (latest !== undefined && 'reason' in latest) {
    throw new InputError({ file: shown, problem: `the latest pack ${latest.name} cannot be read: ${latest.reason}`, fix: 'Name another pack, or build this one again from its claims file and data' });
  }
  return latest;
}

/** Remove temporary folders left by builds that were killed (their process no longer runs). */
export async function sweepTemporary(root: string): Promise<void> {
  if (!existsSync(root)) return;
  for (const name of readdirSync(root)) {
    if (!name.startsWith(TEMP_PREFIX)) continue;
    const pid = Number(name.slice(TEMP_PREFIX.length).split('-')[0]);
    let alive = false;
    try {
      process.kill(pid, 0);
      alive = pid !== process.pid;
    } catch {
      alive = false;
    }
    if (!alive) await rm(join(root, name), { recursive: true, force: true });
  }
}

export interface WriteHooks {
  /** Test hook: throw after this many files have been written, as if writing failed part-way. */
  failAfterFiles?: number;
  /** Test hook: kill the process outright (SIGKILL) after this many files, as if the machine stopped. */
  killAfterFiles?: number;
  /**
   * Test hook, with failAfterFiles: the failure is the file system's error of this code (EACCES, ENOSPC...), thrown
   * as Node throws it for the file being opened. Permission denied cannot be had otherwise when tests run as root.
   */
  failCode?: string;
}

/** Test hooks from the environment (WARRANT_TEST_FAIL_AFTER_FILES, WARRANT_TEST_FAIL_CODE, WARRANT_TEST_KILL_AFTER_FILES); none normally. */
export function hooksFromEnv(env: NodeJS.ProcessEnv = process.env): WriteHooks {
  const hooks: WriteHooks = {};
  const fail = Number(env.WARRANT_TEST_FAIL_AFTER_FILES);
  const kill = Number(env.WARRANT_TEST_KILL_AFTER_FILES);
  if (env.WARRANT_TEST_FAIL_AFTER_FILES !== undefined && Number.isInteger(fail)) hooks.failAfterFiles = fail;
  if (env.WARRANT_TEST_KILL_AFTER_FILES !== undefined && Number.isInteger(kill)) hooks.killAfterFiles = kill;
  if (env.WARRANT_TEST_FAIL_CODE !== undefined && /^E[A-Z]+$/.test(env.WARRANT_TEST_FAIL_CODE)) hooks.failCode = env.WARRANT_TEST_FAIL_CODE;
  return hooks;
}

/**
 * Whether a pack folder is whole: each of `names` an ordinary file that is not empty, results.json readable as a pack,
 * and pack.pdf ending with the %%EOF marker (PDF 1.7, 7.5.5) in its last 1 KB, as a PDF cut short does not.
 */
function wholePack(folder: string, names: string[]): boolean {
  try {
    if (!names.every((rel) => {
      const st = statSync(join(folder, rel));
      return st.isFile() && st.size > 0;
    })) return false;
  } catch {
    return false;
  }
  const results = readResultsOf(folder);
  if (results === undefined || !('results' in results)) return false;
  if (!names.includes('pack.pdf')) return true;
  let fd: number | undefined;
  try {
    fd = openSync(join(folder, 'pack.pdf'), 'r');
    const size = fstatSync(fd).size;
    const tail = Buffer.alloc(Math.min(size, 1024));
    readSync(fd, tail, 0, tail.length, size - tail.length);
    return tail.includes('%%EOF');
  } catch {
    return false;
  } finally {
    if (fd !== undefined) closeSync(fd);
  }
}

/** A pack being written (stagePack): its files as they are made, then the pack put in place whole. */
export interface StagedPack {
  /** A pack of the same name is whole already (the same inputs): nothing is written, only `latest` moves. */
  readonly reused: boolean;
  /** Write one of the pack's files (relative path) into the temporary folder; nothing when the pack is reused. */
  write(rel: string, content: string | Buffer | Buffer[]): void;
  /** Put the pack in place and point `latest` at it. */
  finish(): Promise<{ path: string; reused: boolean }>;
  /** Remove what was written, and the history folder when it was made for this pack and holds nothing else. */
  abandon(): Promise<void>;
}

/** Write a new file from pieces of bytes, one after another, without joining them first. */
function writePieces(file: string, pieces: Buffer[]): void {
  const fd = openSync(file, 'wx');
  try {
    for (let i = 0; i < pieces.length; i += 512) {
      const batch = pieces.slice(i, i + 512);
      let left = batch.reduce((n, b) => n + b.length, 0);
      while (left > 0) {
        const n = writevSync(fd, batch);
        left -= n;
        if (left > 0) {
          // A short write (a full disk reports ENOSPC instead): drop what was written and go on.
          let skip = n;
          while (skip > 0 && batch.length > 0) {
            const first = batch[0]!;
            if (first.length <= skip) {
              skip -= first.length;
              batch.shift();
            } else {
              batch[0] = first.subarray(skip);
              skip = 0;
            }
          }
        }
      }
    }
  } finally {
    closeSync(fd);
  }
}

/**
 * Begin writing a pack into `root/name` through a temporary folder, so that its files can be written as they are made
 * (a chart's files as soon as its page has used it) rather than all held until the end. `names` are the files the
 * pack will hold. When a pack with the same name exists already and is whole (the same inputs), it is left as it is.
 */
export async function stagePack(root: string, name: string, names: string[], hooks: WriteHooks = {}): Promise<StagedPack> {
  // The folders made here, from the top, so that a build stopped before its pack is written leaves none behind.
  const made: string[] = [];
  for (let dir = root; !existsSync(dir) && dirname(dir) !== dir; dir = dirname(dir)) made.unshift(dir);
  makeFolders(root);
  await sweepTemporary(root);
  const target = join(root, name);
  // A folder of that name (the same inputs) is reused, never rewritten, when it is a whole pack: every file this
  // build would write is there, results.json reads as a pack and pack.pdf ends as a PDF does. One with a file
  // deleted or cut short (an earlier pack half there) is written again.
  const reused = wholePack(target, names);
  const tmp = join(root, `${TEMP_PREFIX}${process.pid}-${name}`);
  if (!reused) await rm(tmp, { recursive: true, force: true });
  let written = 0;
  // Written synchronously, each folder made once: a pack is hundreds of small files (a chart and its spec per
  // claim), and a promise round trip per file and per folder cost about 0.1 s of a 200-claim build.
  const folders = new Set<string>();
  return {
    reused,
    write(rel, content) {
      if (reused) return;
      const file = join(tmp, rel);
      if (hooks.failAfterFiles !== undefined && written >= hooks.failAfterFiles) {
        if (hooks.failCode !== undefined) throw Object.assign(new Error(`${hooks.failCode}: open '${file}' (test hook)`), { code: hooks.failCode, syscall: 'open', path: file });
        throw new Error(`build interrupted on purpose after ${written} files (test hook)`);
      }
      if (hooks.killAfterFiles !== undefined && written >= hooks.killAfterFiles) process.kill(process.pid, 'SIGKILL');
      const folder = dirname(file);
      if (!folders.has(folder)) {
        makeFolders(folder);
        folders.add(folder);
      }
      if (Array.isArray(content)) writePieces(file, content);
      else writeFileSync(file, content);
      written += 1;
    },
    async finish() {
      if (!reused) {
        try {
          await rm(target, { recursive: true, force: true });
          await rename(tmp, target);
        } catch (e) {
          await rm(tmp, { recursive: true, force: true });
          throw e;
        }
      }
      await pointLatest(root, name);
      return { path: target, reused };
    },
    async abandon() {
      await rm(tmp, { recursive: true, force: true });
      for (const dir of made.reverse()) {
        try {
          rmdirSync(dir);
        } catch {
          break; // not empty (another build's pack, or something of the user's): left as it is
        }
      }
    },
  };
}

/**
 * Write a pack's files into `root/name` through a temporary folder, then point `latest` at it. When a pack with the
 * same name exists already (same inputs), it is left as it is and only `latest` moves.
 */
export async function storePack(root: string, name: string, files: Array<[string, string | Buffer]>, hooks: WriteHooks = {}): Promise<{ path: string; reused: boolean }> {
  const staged = await stagePack(root, name, files.map(([rel]) => rel), hooks);
  try {
    for (const [rel, content] of files) staged.write(rel, content);
  } catch (e) {
    await staged.abandon();
    throw e;
  }
  return staged.finish();
}

/**
 * What stands where the `latest` link belongs, when it is not a link ("a folder", "a file"); undefined when there
 * is a link or nothing. Checked before a build starts, so that nothing is written when the link cannot be moved.
 */
export function latestInTheWay(root: string): string | undefined {
  let st;
  try {
    st = lstatSync(join(root, LATEST));
  } catch {
    return undefined;
  }
  if (st.isSymbolicLink()) return undefined;
  return st.isDirectory() ? 'a folder' : st.isFile() ? 'a file' : (otherThanFile(st) ?? 'something else');
}

/** The InputError for a `latest` that is not a link (`shown` is the history folder as the user named it). */
export function latestProblem(shown: string, what: string): InputError {
  const link = join(shown, LATEST);
  return new InputError({
    file: link,
    field: '--out',
    found: what,
    problem: `warrant keeps a link named ${LATEST} in the history folder pointing to the newest pack, but ${link} is ${what}, not a link, so it cannot be moved to the new pack`,
    fix: `Move or rename ${link} (e.g. to ${link}-old), then build again; warrant makes the link itself`,
  });
}

/** Replace the `latest` link atomically (a new link renamed over the old one); the temporary link never stays. */
async function pointLatest(root: string, name: string): Promise<void> {
  const link = join(root, LATEST);
  try {
    if ((await readlink(link)) === name) return;
  } catch {
    // no link yet
  }
  const inTheWay = latestInTheWay(root);
  if (inTheWay !== undefined) throw latestProblem(root, inTheWay);
  const tmp = join(root, `${TEMP_PREFIX}${process.pid}-link`);
  await rm(tmp, { force: true });
  try {
    await symlink(name, tmp, 'dir');
    await rename(tmp, link);
  } catch (e) {
    await rm(tmp, { force: true });
    throw writeFailure(e, { file: link, field: '--out' }, 'pointing the latest link at the new pack', root, 'give --out another folder') ?? e;
  }
}
