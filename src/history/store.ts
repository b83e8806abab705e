/**
 * Where packs live. Each claims file has a history folder (default out/<claims file name>/); every build writes a
 * new pack folder inside it, named by the build day and the pack's fingerprint, and never touches earlier ones.
 * A `latest` link names the newest. A pack is written into a temporary folder and renamed into place, so an
 * interrupted build leaves the earlier packs intact and no half-written pack behind.
 */
import { existsSync, readdirSync, readFileSync, readlinkSync, realpathSync, statSync } from 'node:fs';
import { mkdir, readlink, rename, rm, symlink, writeFile } from 'node:fs/promises';
import { basename, join } from 'node:path';
import type { ResultsFile } from '../results/results.js';

export const LATEST = 'latest';
const TEMP_PREFIX = '.building-';
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

function readResults(folder: string): ResultsFile | undefined {
  const file = join(folder, 'results.json');
  if (!existsSync(file)) return undefined;
  try {
    return JSON.parse(readFileSync(file, 'utf8')) as ResultsFile;
  } catch {
    return undefined;
  }
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
  const link = join(root, LATEST);
  let name: string;
  try {
    name = basename(readlinkSync(link));
  } catch {
    return undefined;
  }
  const results = readResults(join(root, name));
  return results ? { name, path: join(root, name), results } : undefined;
}

/** A pack folder given on the command line: a pack folder, its results.json, or a history folder (its latest). */
export function openPack(path: string): StoredPack | undefined {
  const given = path.endsWith('.json') ? join(path, '..') : path;
  // The `latest` link (or any link) is followed, so the pack is named by its real folder.
  let folder = given;
  try {
    folder = realpathSync(given);
  } catch {
    return undefined;
  }
  const direct = readResults(folder);
  if (direct) return { name: basename(folder), path: folder, results: direct };
  return latestPack(folder);
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
}

/** Test hooks from the environment (WARRANT_TEST_FAIL_AFTER_FILES, WARRANT_TEST_KILL_AFTER_FILES); none normally. */
export function hooksFromEnv(env: NodeJS.ProcessEnv = process.env): WriteHooks {
  const hooks: WriteHooks = {};
  const fail = Number(env.WARRANT_TEST_FAIL_AFTER_FILES);
  const kill = Number(env.WARRANT_TEST_KILL_AFTER_FILES);
  if (env.WARRANT_TEST_FAIL_AFTER_FILES !== undefined && Number.isInteger(fail)) hooks.failAfterFiles = fail;
  if (env.WARRANT_TEST_KILL_AFTER_FILES !== undefined && Number.isInteger(kill)) hooks.killAfterFiles = kill;
  return hooks;
}

/**
 * Write a pack's files into `root/name` through a temporary folder, then point `latest` at it. When a pack with the
 * same name exists already (same inputs), it is left as it is and only `latest` moves.
 */
export async function storePack(root: string, name: string, files: Array<[string, string | Buffer]>, hooks: WriteHooks = {}): Promise<{ path: string; reused: boolean }> {
  await mkdir(root, { recursive: true });
  await sweepTemporary(root);
  const target = join(root, name);
  let reused = true;
  if (!existsSync(join(target, 'results.json'))) {
    reused = false;
    const tmp = join(root, `${TEMP_PREFIX}${process.pid}-${name}`);
    await rm(tmp, { recursive: true, force: true });
    try {
      let written = 0;
      for (const [rel, content] of files) {
        if (hooks.failAfterFiles !== undefined && written >= hooks.failAfterFiles) {
          throw new Error(`build interrupted on purpose after ${written} files (test hook)`);
        }
        if (hooks.killAfterFiles !== undefined && written >= hooks.killAfterFiles) process.kill(process.pid, 'SIGKILL');
        const file = join(tmp, rel);
        await mkdir(join(file, '..'), { recursive: true });
        await writeFile(file, content);
        written += 1;
      }
      await rm(target, { recursive: true, force: true });
      await rename(tmp, target);
    } catch (e) {
      await rm(tmp, { recursive: true, force: true });
      throw e;
    }
  }
  await pointLatest(root, name);
  return { path: target, reused };
}

/** Replace the `latest` link atomically (a new link renamed over the old one). */
async function pointLatest(root: string, name: string): Promise<void> {
  const link = join(root, LATEST);
  try {
    if ((await readlink(link)) === name) return;
  } catch {
    // no link yet
  }
  const tmp = join(root, `${TEMP_PREFIX}${process.pid}-link`);
  await rm(tmp, { force: true });
  await symlink(name, tmp, 'dir');
  await rename(tmp, link);
}
