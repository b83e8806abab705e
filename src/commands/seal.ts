/**
 * `warrant seal claims.yaml [--date YYYY-MM-DD]`: record, in a small file beside the claims file
 * (claims.yaml -> claims.seal.json), each claim's fingerprint (src/history/fingerprint.ts: what the claim commits to)
 * and the date it was sealed. Run it before the data are opened; every pack built later states what the seal proves:
 * which claims are unchanged since the seal, the seal's date against the data's date, and which claims were added or
 * edited after sealing.
 *
 * Sealing again keeps the date of every claim that is unchanged and gives the new date to claims added or edited
 * since, so a seal never makes a claim look older than it is. The date is the --date option or today's date (UTC)
 * when the command runs: sealing is not a pack build, and the pack only reads the file.
 *
 * A seal is evidence the organisation keeps, not proof against someone who edits the file by hand: it is worth what
 * the place it is kept in (version control, an email to the committee) is worth.
 */
import { existsSync, readFileSync, statSync } from 'node:fs';
import { basename, dirname, extname, join, resolve } from 'node:path';
import { readClaims } from '../claims/read.js';
import type { ClaimsFile } from '../claims/types.js';
import { InputError } from '../errors.js';
import { writeFailure, writeWhole } from '../files.js';
import { claimFingerprint } from '../history/fingerprint.js';
import { today } from '../history/store.js';

export const SEAL_FORMAT = 1;

export interface SealFile {
  format: number;
  /** The claims file's name (the seal sits beside it). */
  claimsFile: string;
  /** One entry per claim: its id, its fingerprint and the day (YYYY-MM-DD) it was sealed in this form. */
  claims: Array<{ id: string; fingerprint: string; sealed: string }>;
}

/** claims.yaml -> claims.seal.json, in the same folder. */
export function sealPath(claimsPath: string): string {
  return join(dirname(claimsPath), `${basename(claimsPath, extname(claimsPath))}.seal.json`);
}

function validDay(text: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.toISOString().slice(0, 10) === text;
}

/** The seal beside a claims file, or undefined when there is none. A seal that cannot be read is an InputError. */
export function readSeal(claimsPath: string, display: string = sealPath(claimsPath)): SealFile | undefined {
  const path = sealPath(claimsPath);
  if (!existsSync(path)) return undefined;
  const bad = (problem: string) =>
    new InputError({ file: display, problem, fix: 'Restore the seal file from where you keep it (version control, the email you sent), or delete it and seal the claims again with warrant seal' });
  if (!statSync(path).isFile()) throw bad('the seal is not a file');
  let parsed: unknown;
  try {
    parsed = JSON.parse(readFileSync(path, 'utf8'));
  } catch (e) {
    throw bad(`the seal is not valid JSON (${(e as Error).message})`);
  }
  const s = parsed as Partial<SealFile>;
  if (s === null || typeof s !== 'object' || s.format !== SEAL_FORMAT || !Array.isArray(s.claims)) throw bad(`the seal does not have the layout warrant writes (format ${SEAL_FORMAT} with a list of claims)`);
  for (const [i, c] of s.claims.entries()) {
    if (typeof c?.id !== 'string' || typeof c.fingerprint !== 'string' || typeof c.sealed !== 'string' || !validDay(c.sealed)) {
      throw bad(`entry ${i + 1} of the seal is not an id, a fingerprint and a date (YYYY-MM-DD)`);
    }
  }
  return s as SealFile;
}

/** The seal for these claims on `day`, keeping the earlier date of every claim unchanged since `previous`. */
export function sealClaims(claims: ClaimsFile, claimsFileName: string, day: string, previous?: SealFile): SealFile {
  const before = new Map((previous?.claims ?? []).map((c) => [`${c.id}\n${c.fingerprint}`, c.sealed]));
  return {
    format: SEAL_FORMAT,
    claimsFile: claimsFileName,
    claims: claims.claims.map((c) => {
      const fingerprint = claimFingerprint(c);
      return { id: c.id, fingerprint, sealed: before.get(`${c.id}\n${fingerprint}`) ?? day };
    }),
  };
}

export interface SealOptions {
  claims: string;
  date?: string;
  cwd?: string;
  write?: (text: string) => void;
  now?: Date;
}

export async function seal(options: SealOptions): Promise<number> {
  const cwd = options.cwd ?? process.cwd();
  const write = options.write ?? ((t: string) => process.stdout.write(t));
  const path = resolve(cwd, options.claims);
  const day = options.date ?? today(options.now);
  if (!validDay(day)) {
    throw new InputError({ file: 'command line', field: '--date', found: day, problem: 'the seal date is not a day written as YYYY-MM-DD', fix: 'Write the date as year-month-day, e.g. --date 2026-02-12, or leave --date out to use today' });
  }
  const claims = await readClaims(path, options.claims);
  const target = sealPath(path);
  const previous = readSeal(path, target);
  const sealed = sealClaims(claims, basename(path), day, previous);
  // Written through a temporary file renamed into place, so an interrupted seal never leaves half a file.
  try {
    writeWhole(target, `${JSON.stringify(sealed, null, 2)}\n`, { replace: true });
  } catch (e) {
    throw writeFailure(e, { file: target }, 'writing the seal', dirname(target), 'copy the claims file and its data into a folder you can write in and seal it there') ?? e;
  }
  const kept = sealed.claims.filter((c) => c.sealed !== day).length;
  const fresh = sealed.claims.length - kept;
  write(
    `Sealed ${fresh} claim${fresh === 1 ? '' : 's'} on ${day}${kept > 0 ? ` (${kept} unchanged since an earlier seal keep their date)` : ''}: ${target}\n` +
      'Keep this file with the claims file (in version control, or send it to the committee); packs built from these claims will say when they were sealed.\n',
  );
  return 0;
}
