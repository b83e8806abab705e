/**
 * One guard for every file warrant reads (claims file, data files, templates, earlier packs' results.json): it must
 * be an ordinary file. A named pipe with no writer, a device such as /dev/zero or /dev/urandom, or a socket would
 * make a read wait for ever or never end, so each is refused, by name, before it is opened. The small files read
 * whole (claims, templates, results.json) are opened without blocking, checked again on the open file, and read in
 * pieces up to a cap that holds whatever size the file reports (files under /proc report 0 bytes).
 *
 * File-system failures (permission denied, a path too long, a full disk) become plain sentences here, so that every
 * reader and writer says them the same way.
 */
import { closeSync, constants, existsSync, fstatSync, linkSync, mkdirSync, openSync, readSync, renameSync, rmSync, statSync, writeFileSync, type Stats } from 'node:fs';
import { dirname } from 'node:path';
import { InputError, type Problem } from './errors.js';

/** Where a problem with a file is reported: the file as the user knows it, and optionally the line and field. */
export type Place = Omit<Problem, 'problem' | 'fix'>;

/** The fix for a data file that is not where its path says (the path may come from a claims file or the command line). */
export const DATA_PATH_FIX = 'Check the path: in a claims file it is read relative to the claims file, on the command line relative to the folder you run warrant in';

/** What a path is when it is not an ordinary file ("a named pipe (FIFO)"), or undefined for an ordinary file. */
export function otherThanFile(st: Stats): string | undefined {
  if (st.isFile()) return undefined;
  if (st.isDirectory()) return 'a folder';
  if (st.isFIFO()) return 'a named pipe (FIFO)';
  if (st.isCharacterDevice()) return 'a device (character special file)';
  if (st.isBlockDevice()) return 'a device (block special file)';
  if (st.isSocket()) return 'a socket';
  return 'not an ordinary file';
}

/** What is at `abs` when it exists and is not an ordinary file (following links); undefined otherwise. */
export function notOrdinaryFile(abs: string): string | undefined {
  try {
    return otherThanFile(statSync(abs));
  } catch {
    return undefined;
  }
}

/** The sentence for a path that is a pipe, a device or a socket (folders have their own messages at each caller). */
export function notOrdinaryProblem(abs: string, kind: string, place: Place, role: string, fix?: string): Problem {
  // A folder does not hang a read; it is simply not the file (a caller with its own folder message says it first).
  if (kind === 'a folder') return { ...place, problem: `the ${role} ${abs} is a folder, not a file`, fix: fix ?? `Give the path of the ${role} itself, inside the folder` };
  return {
    ...place,
    problem: `the ${role} ${abs} is ${kind}, not an ordinary file; warrant reads only ordinary files, since reading from ${kind} could wait for ever or never end`,
    fix: fix ?? `Save the ${role} as an ordinary file and give the path of that file`,
  };
}

/** Throw an InputError unless `abs` is an ordinary file (a missing path is left to the caller's own message). */
export function requireOrdinaryFile(abs: string, place: Place, role: string, fix?: string): void {
  const kind = notOrdinaryFile(abs);
  if (kind !== undefined) throw new InputError(notOrdinaryProblem(abs, kind, place, role, fix));
}

/** The code of the error makeFolders throws when a folder exists but refuses a new folder inside it (mkdir says ENOENT). */
const NO_NEW_FOLDERS = 'WARRANT_NO_NEW_FOLDERS';

/** A file-system failure as a sentence ("permission was denied"), or undefined when it is not one warrant knows. */
export function fsReason(e: unknown): string | undefined {
  const code = (e as { code?: unknown } | null)?.code;
  switch (code) {
    case 'ENOENT':
      return 'it does not exist';
    case 'EACCES':
    case 'EPERM':
      return 'permission was denied';
    case 'ENAMETOOLONG':
      return 'the path, or a name in it, is longer than the file system allows';
    case 'ENOSPC':
      return 'there is no space left on the disk';
    case 'EDQUOT':
      return 'the disk quota is used up';
    case 'EROFS':
      return 'the file system is read-only';
    case 'ENOTDIR':
      return 'a part of the path is a file where a folder was expected';
    case 'EISDIR':
      return 'it is a folder';
    case 'ELOOP':
      return 'the path goes round a loop of symbolic links';
    case 'EMFILE':
    case 'ENFILE':
      return 'too many files are open at once on this machine';
    case 'EIO':
      return 'the disk reported an input/output error';
    case 'EBUSY':
      return 'the file is in use by another program';
    case 'EEXIST':
      return 'something with that name is already there';
    case NO_NEW_FOLDERS:
      return 'the folder above it takes no new folders or files (a system folder such as /proc or /sys)';
    default:
      return undefined;
  }
}

/**
 * Make a folder and any missing folders above it, one at a time from the top. Node's own recursive mkdir retries for
 * ever (at full speed) when a folder exists but mkdir in it says ENOENT, as in /proc/self; here that is an error
 * with its own code (said by fsReason as a folder that takes no new folders), as is a file in the path (ENOTDIR).
 */
export function makeFolders(abs: string): void {
  const missing: string[] = [];
  for (let dir = abs; ; dir = dirname(dir)) {
    try {
      if (!statSync(dir).isDirectory()) throw Object.assign(new Error(`ENOTDIR: not a directory, mkdir '${abs}'`), { code: 'ENOTDIR' });
      break;
    } catch (e) {
      if ((e as { code?: string }).code !== 'ENOENT' || dirname(dir) === dir) throw e;
      missing.push(dir);
    }
  }
  for (const dir of missing.reverse()) {
    try {
      mkdirSync(dir);
    } catch (e) {
      const code = (e as { code?: string }).code;
      if (code === 'EEXIST' && notFolder(dir) === false) continue; // made meanwhile by another build
      if (code === 'ENOENT') throw Object.assign(new Error(`the folder ${dirname(dir)} takes no new folders (mkdir '${dir}' said ENOENT)`), { code: NO_NEW_FOLDERS });
      throw e;
    }
  }
}

/** Whether something at `abs` is not a folder (undefined when nothing can be found there, e.g. a broken link). */
function notFolder(abs: string): boolean | undefined {
  try {
    return !statSync(abs).isDirectory();
  } catch {
    return undefined;
  }
}

/** An InputError for a file-system failure while `doing` something with a file, or undefined for other errors. */
export function fsFailure(e: unknown, place: Place, doing: string, fix?: string): InputError | undefined {
  if (e instanceof InputError) return e;
  const reason = fsReason(e);
  if (reason === undefined) return undefined;
  const code = String((e as { code: string }).code);
  const fixes: Record<string, string> = {
    ENOSPC: 'Free some space on the disk (or choose another folder) and run the command again',
    EDQUOT: 'Free some space within your quota (or choose another folder) and run the command again',
    EACCES: 'Allow access to the file and its folder, or copy the file somewhere you can use',
    EPERM: 'Allow access to the file and its folder, or copy the file somewhere you can use',
    ENAMETOOLONG: 'Use a shorter path or shorter folder and file names',
    EROFS: 'Choose a folder on a writable disk',
    ENOTDIR: 'Check each folder named in the path: one of them is a file',
    ELOOP: 'Check the symbolic links in the path: one leads back to itself',
    [NO_NEW_FOLDERS]: 'Choose a folder of your own to write into, e.g. out',
  };
  return new InputError({ ...place, problem: `${doing} failed: ${reason}`, fix: fix ?? fixes[code] ?? 'Check the path and the file, then run the command again' });
}

/** Whether a folder belongs to a file system of the kernel's (/proc, /sys), whose permissions are not the user's to change. */
function systemFolder(abs: string): boolean {
  return /^\/(proc|sys)(\/|$)/.test(abs);
}

/**
 * The folder a write failed in: the folder itself when its access was checked, else the folder holding the file or
 * folder being made (Node names it in the error's path), else `fallback`.
 */
function failedFolder(e: unknown, fallback: string): string {
  const { path, syscall } = (e ?? {}) as { path?: unknown; syscall?: unknown };
  if (typeof path !== 'string' || path === '') return fallback;
  return syscall === 'access' ? path : dirname(path);
}

/**
 * An InputError for a file-system failure while writing (a pack, the demo, a starter claims file, a seal), or
 * undefined for other errors. It is said as a write: the folder that cannot be written and why, with the fixes for a
 * write (another place, the folder's permissions, space on the disk), never the fixes for a file that cannot be read.
 * `folder` is the folder written into, used when the error does not name one; `elsewhere` says how to write somewhere
 * else ("give --out another folder"); `show` writes a path as the user knows it.
 */
export function writeFailure(e: unknown, place: Place, doing: string, folder: string, elsewhere: string, show: (abs: string) => string = (abs) => abs): InputError | undefined {
  if (e instanceof InputError) return e;
  const code = (e as { code?: unknown } | null)?.code;
  const reason = fsReason(e);
  if (reason === undefined) return undefined;
  const where = failedFolder(e, folder);
  const shown = show(where);
  const Elsewhere = elsewhere.charAt(0).toUpperCase() + elsewhere.slice(1);
  const cannot = (why: string, fix: string): InputError => new InputError({ ...place, problem: `${doing} failed: the folder ${shown} cannot be written: ${why}`, fix });
  switch (code) {
    case 'EACCES':
    case 'EPERM':
      return cannot(
        'permission was denied',
        systemFolder(where) ? `${Elsewhere}: one of your own, e.g. out` : `${Elsewhere}, or change the permissions of ${shown} so that you can write in it (e.g. chmod u+w ${shown})`,
      );
    case 'EROFS':
      return cannot('it is on a read-only file system', `${Elsewhere}, on a disk that can be written`);
    case 'ENOSPC':
      return cannot('there is no space left on its disk', `Free some space on the disk and run the command again, or ${elsewhere} on another disk`);
    case 'EDQUOT':
      return cannot('your disk quota is used up', `Free some space within your quota and run the command again, or ${elsewhere} on another disk`);
    case 'EISDIR': {
      const at = (e as { dest?: unknown; path?: unknown }).dest ?? (e as { path?: unknown }).path;
      const what = typeof at === 'string' ? show(at.replace(/\.\d+\.partial$/, '')) : 'the file to be written';
      return new InputError({ ...place, problem: `${doing} failed: ${what} is a folder, where warrant writes a file`, fix: `Move or rename that folder, or ${elsewhere}` });
    }
    case 'ENAMETOOLONG':
      return new InputError({ ...place, problem: `${doing} failed: the path, or a name in it, is longer than the file system allows`, fix: `Use a shorter path or shorter folder names: ${elsewhere} with a shorter path` });
    case 'ENOTDIR':
      return new InputError({ ...place, problem: `${doing} failed: a part of the path is a file where a folder was expected`, fix: `Check each folder named in the path (one of them is a file), or ${elsewhere}` });
    default:
      return fsFailure(e, place, doing);
  }
}

/**
 * Read a small file whole, refusing anything that is not an ordinary file and stopping as soon as more than `cap`
 * bytes have arrived (whatever size the file reports). `tooBig` makes the error for a file over the cap; the size it
 * is given is the reported size when that is larger, else "more than cap".
 */
export function readOrdinaryFile(abs: string, cap: number, place: Place, role: string, tooBig: (size: string) => InputError): Buffer {
  let fd: number;
  try {
    // O_NONBLOCK: opening a named pipe with no writer would otherwise wait for ever.
    fd = openSync(abs, constants.O_RDONLY | constants.O_NONBLOCK);
  } catch (e) {
    throw fsFailure(e, place, `reading the ${role}`) ?? e;
  }
  try {
    const st = fstatSync(fd);
    const kind = otherThanFile(st);
    if (kind !== undefined) throw new InputError(notOrdinaryProblem(abs, kind, place, role));
    if (st.size > cap) throw tooBig(`${st.size} bytes`);
    const pieces: Buffer[] = [];
    let total = 0;
    for (;;) {
      const piece = Buffer.allocUnsafe(64 * 1024);
      const n = readSync(fd, piece, 0, piece.length, null);
      if (n === 0) break;
      total += n;
      if (total > cap) throw tooBig(`more than ${cap} bytes`);
      pieces.push(piece.subarray(0, n));
    }
    return Buffer.concat(pieces, total);
  } catch (e) {
    throw fsFailure(e, place, `reading the ${role}`) ?? e;
  } finally {
    closeSync(fd);
  }
}

/**
 * Write a file whole or not at all: into a temporary file beside it (`<name>.<pid>.partial`), then renamed over the
 * file (`replace`) or linked to its name, which fails when anything is there already (so an existing file is never
 * touched). A full disk or an interruption leaves the file as it was and no temporary file behind. File-system
 * failures are thrown as they come; callers turn them into sentences with fsFailure.
 */
export function writeWhole(abs: string, data: string | Buffer, { replace }: { replace: boolean }): void {
  const temporary = `${abs}.${process.pid}.partial`;
  try {
    try {
      writeFileSync(temporary, data);
    } catch (e) {
      // The folder is there, yet the new file "does not exist": a folder that takes no new files, as in /proc.
      if ((e as { code?: string }).code === 'ENOENT' && notFolder(dirname(abs)) === false) throw Object.assign(new Error(`the folder ${dirname(abs)} takes no new files`), { code: NO_NEW_FOLDERS });
      throw e;
    }
    if (replace) renameSync(temporary, abs);
    else {
      try {
        linkSync(temporary, abs);
      } catch (e) {
        // A file system without hard links (some network and FAT disks): rename, having looked first.
        const code = (e as { code?: string }).code;
        if ((code !== 'EPERM' && code !== 'ENOTSUP' && code !== 'EXDEV') || existsSync(abs)) throw e;
        renameSync(temporary, abs);
      }
    }
  } finally {
    try {
      rmSync(temporary, { force: true });
    } catch {
      // Not ours to remove (a folder of that name): the error that matters was thrown above.
    }
  }
}
