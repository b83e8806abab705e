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
import { closeSync, constants, fstatSync, openSync, readSync, statSync, type Stats } from 'node:fs';
import { InputError, type Problem } from './errors.js';

/** Where a problem with a file is reported: the file as the user knows it, and optionally the line and field. */
export type Place = Omit<Problem, 'problem' | 'fix'>;

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
    default:
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
  };
  return new InputError({ ...place, problem: `${doing} failed: ${reason}`, fix: fix ?? fixes[code] ?? 'Check the path and the file, then run the command again' });
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
