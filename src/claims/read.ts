/**
 * Reading a claims file, in stages:
 *
 *   bytes (size limit, SHA-256, UTF-8)
 *     -> YAML document (syntax errors with line:column)          yaml.ts
 *     -> schema check (plain messages, closest-key suggestions)   validate.ts
 *     -> cross-field and file-system rules                        rules.ts
 *     -> normalized ClaimsFile (defaults, resolved paths, places) normalize.ts
 *
 * Problems from the schema and the rules are gathered together and thrown as one InputError, in file order.
 */
import { createHash } from 'node:crypto';
import { stat } from 'node:fs/promises';
import { dirname, isAbsolute, relative, resolve } from 'node:path';
import { InputError, type Problem } from '../errors.js';
import { fsFailure, readOrdinaryFile } from '../files.js';
import { normalize } from './normalize.js';
import { crossFieldProblems } from './rules.js';
import type { ClaimsFile } from './types.js';
import { schemaProblems } from './validate.js';
import { parseYaml, type ParsedYaml } from './yaml.js';

/** Claims files are a few kilobytes; anything over this is not a claims file. */
export const MAX_CLAIMS_BYTES = 1024 * 1024;

/** How a path is shown to the user: relative to the working folder when that is shorter and inside it. */
export function displayPathFor(absPath: string): string {
  const rel = relative(process.cwd(), absPath);
  return rel !== '' && !rel.startsWith('..') && !isAbsolute(rel) ? rel : absPath;
}

/** Sort problems by line, then column; problems without a line go last, in their original order. */
export function inFileOrder(problems: Problem[]): Problem[] {
  return problems
    .map((p, i) => ({ p, i }))
    .sort((a, b) => {
      const la = a.p.line ?? Infinity;
      const lb = b.p.line ?? Infinity;
      if (la !== lb) return la - lb;
      const ca = a.p.column ?? 0;
      const cb = b.p.column ?? 0;
      return ca !== cb ? ca - cb : a.i - b.i;
    })
    .map((x) => x.p);
}

/**
 * Whether the bytes are UTF-16 text: a byte-order mark FF FE or FE FF (Unicode 15, 23.8), or, without one, a zero
 * byte in every other place of the first characters (ASCII text in UTF-16), which UTF-8 text never has.
 */
function looksUtf16(bytes: Buffer): boolean {
  if (bytes.length >= 2 && ((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))) return true;
  const n = Math.min(bytes.length, 64) & ~1;
  if (n < 4) return false;
  let evenZero = 0;
  let oddZero = 0;
  for (let i = 0; i < n; i += 2) {
    if (bytes[i] === 0) evenZero += 1;
    if (bytes[i + 1] === 0) oddZero += 1;
  }
  return Math.max(evenZero, oddZero) * 2 >= n / 2 && Math.min(evenZero, oddZero) === 0;
}

/** Decode UTF-8 strictly; on failure report the line and column of the first bad byte. */
function decodeUtf8(bytes: Buffer, file: string): string {
  if (looksUtf16(bytes)) {
    throw new InputError({ file, line: 1, column: 1, problem: 'the claims file is UTF-16 text (often saved as "Unicode" or "Unicode text"), and warrant reads claims files in UTF-8', fix: 'Save it again as UTF-8 in your text editor' });
  }
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(bytes).replace(/^\uFEFF/, '');
  } catch {
    const loose = new TextDecoder('utf-8').decode(bytes).replace(/^\uFEFF/, '');
    const at = loose.indexOf('\uFFFD');
    const before = loose.slice(0, Math.max(0, at));
    const line = before.split('\n').length;
    const column = at - before.lastIndexOf('\n');
    throw new InputError({
      file,
      line,
      column,
      problem: 'the claims file is not UTF-8 text (it may have been saved in an older encoding such as Windows-1252)',
      fix: 'Save it again as UTF-8 in your text editor',
    });
  }
}

/** Names of the control characters most often met, for the message. */
const CONTROL_NAMES: Record<number, string> = { 0: 'NUL', 7: 'BEL', 8: 'backspace', 0x0b: 'vertical tab', 0x0c: 'form feed', 0x1a: 'SUB (end-of-file mark)', 0x1b: 'ESC', 0x7f: 'DEL' };

/**
 * The first character YAML does not allow in a file (YAML 1.2.2 §5.1, c-printable: tab, line feed, carriage return
 * and printable characters): a NUL byte, another C0 or C1 control character, DEL, U+FFFE or U+FFFF. They are
 * invisible in most editors and come from damaged saves or pasted binary; refused wherever they are, as YAML does.
 */
export function controlCharacter(text: string, file: string): InputError | undefined {
  // eslint-disable-next-line no-control-regex
  const at = text.search(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u0084\u0086-\u009F\uFFFE\uFFFF]/);
  if (at < 0) return undefined;
  const code = text.charCodeAt(at);
  const before = text.slice(0, at);
  const line = before.split('\n').length;
  const column = at - before.lastIndexOf('\n');
  const hex = `U+${code.toString(16).toUpperCase().padStart(4, '0')}`;
  const name = CONTROL_NAMES[code];
  return new InputError({
    file,
    line,
    column,
    found: hex,
    problem: `the claims file holds a control character (${hex}${name !== undefined ? `, ${name}` : ''}), which YAML does not allow anywhere in a file`,
    fix: 'Delete the character (most editors do not show it; it often comes from a damaged save or text pasted from another program); inside a double-quoted value, write an escape such as \\t if the character is really meant',
  });
}

/**
 * Read, check and normalize a claims file.
 * @param path the claims file (absolute, or relative to the working folder)
 * @param displayPath how to name the file in messages (default: relative to the working folder)
 * @throws InputError listing every problem found, each with line:column and a fix
 */
export async function readClaims(path: string, displayPath?: string): Promise<ClaimsFile> {
  const t = await claimsText(path, displayPath);
  return parseClaimsText(t.text, t);
}

/** The bytes of a claims file, checked and decoded. */
async function claimsText(path: string, displayPath?: string): Promise<{ absPath: string; file: string; sha256: string; text: string }> {
  const absPath = resolve(path);
  const file = displayPath ?? displayPathFor(absPath);
  let info;
  try {
    info = await stat(absPath);
  } catch (e) {
    const failed = (e as { code?: string }).code === 'ENOENT' ? undefined : fsFailure(e, { file }, 'looking for the claims file');
    if (failed) throw failed;
    throw new InputError({
      file,
      problem: 'the claims file was not found',
      fix: `Check the path; it was looked for at ${absPath}`,
    });
  }
  if (info.isDirectory()) {
    throw new InputError({
      file,
      problem: 'this is a folder, not a claims file',
      fix: 'Give the path of the .yaml claims file inside the folder',
    });
  }
  const tooBig = (size: string): InputError =>
    new InputError({
      file,
      found: size,
      problem: `the claims file is larger than ${MAX_CLAIMS_BYTES / 1024 / 1024} MB, far more than any set of claims needs`,
      fix: 'Check that this is the claims file and not a data file; data files belong under sources',
    });
  // Refuses a pipe or a device before reading, and stops past the cap even when the file reports 0 bytes.
  const bytes = readOrdinaryFile(absPath, MAX_CLAIMS_BYTES, { file }, 'claims file', tooBig);
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const text = decodeUtf8(bytes, file);
  const control = controlCharacter(text, file);
  if (control) throw control;
  return { absPath, file, sha256, text };
}

/** What `warrant check` needs: every problem in the file, and the normalized claims whenever they can be built. */
export interface LenientRead {
  file: string;
  problems: Problem[];
  /** Present unless the file could not be read, is not YAML, or breaks the schema. */
  claims?: ClaimsFile;
  parsed?: ParsedYaml;
}

/**
 * Read a claims file without stopping at its problems: when only cross-field rules fail (a confidence of 1.5, a
 * duplicated id), the claims are still normalized, with unreadable amounts replaced by their defaults, so that the
 * data can be checked in the same pass.
 */
export async function readClaimsLeniently(path: string, displayPath?: string): Promise<LenientRead> {
  let t;
  try {
    t = await claimsText(path, displayPath);
  } catch (e) {
    if (e instanceof InputError) return { file: displayPath ?? displayPathFor(resolve(path)), problems: e.problems };
    throw e;
  }
  const outcome = parseYaml(t.text, t.file);
  if (!outcome.ok) return { file: t.file, problems: inFileOrder(outcome.problems) };
  const parsed = outcome.parsed;
  const problems = schemaProblems(parsed, t.file);
  if (parsed.data === null || typeof parsed.data !== 'object' || Array.isArray(parsed.data)) return { file: t.file, problems };
  const schemaClean = problems.length === 0;
  problems.push(...crossFieldProblems(parsed, t.file, dirname(t.absPath)));
  if (!schemaClean) return { file: t.file, problems: inFileOrder(problems), parsed };
  return { file: t.file, problems: inFileOrder(problems), parsed, claims: normalize(parsed, t.absPath, t.sha256, true) };
}

/** The checks after reading the bytes: exposed for tests and for callers that already hold the text. */
export function parseClaimsText(text: string, opts: { absPath: string; file: string; sha256: string }): ClaimsFile {
  const outcome = parseYaml(text, opts.file);
  if (!outcome.ok) throw new InputError(inFileOrder(outcome.problems));
  const parsed = outcome.parsed;
  const problems = schemaProblems(parsed, opts.file);
  // A file that is not a mapping at all has nothing further to check.
  if (parsed.data !== null && typeof parsed.data === 'object' && !Array.isArray(parsed.data)) {
    problems.push(...crossFieldProblems(parsed, opts.file, dirname(opts.absPath)));
  }
  if (problems.length > 0) throw new InputError(inFileOrder(problems));
  return normalize(parsed, opts.absPath, opts.sha256);
}
