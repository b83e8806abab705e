/**
 * `warrant demo <folder> [--force] [--no-build]`: copy the demo shipped in the package (its claims file and both
 * releases of its invented data) into a folder of the user's choice, so that someone who installed warrant can see a
 * pack without cloning anything. The command line then builds the pack from the copy (src/cli.ts), exactly as
 * `warrant build claims.yaml` would from inside the folder.
 *
 * Existing files are never replaced without --force; every conflict is found before anything is written, and each
 * file is written under a temporary name and renamed into place, so a failure leaves no half-written file.
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { dirname, join, relative, resolve, sep } from 'node:path';
import { displayPathFor } from '../claims/read.js';
import { claimsSchemaPath } from '../claims/schema.js';
import { InputError } from '../errors.js';
import { makeFolders, writeFailure, writeWhole } from '../files.js';
import { packageRoot } from '../paths.js';

export interface DemoOptions {
  /** The folder to write into (created if missing). */
  folder: string;
  /** Replace files of the same names already in the folder. */
  force?: boolean;
  /** Where messages go (default: process.stdout). */
  write?: (text: string) => void;
}

export interface DemoWritten {
  /** The folder, absolute. */
  folder: string;
  /** The claims file written, absolute. */
  claims: string;
  /** The history folder `warrant build claims.yaml` uses when run inside the folder, absolute. */
  history: string;
  /** Every file written, relative to the folder with / separators, claims file first. */
  files: string[];
  /** Those that replaced a file already there (only with force). */
  replaced: string[];
}

/** The claims file's name in the folder; its history folder is out/<this name without .yaml>. */
const CLAIMS = 'claims.yaml';
const SCHEMA_LINE = /^# yaml-language-server: \$schema=.*$/m;

/** The files of the shipped demo, relative to its folder: the claims file, then every data file in name order. */
function demoFiles(demoDir: string): string[] {
  const out: string[] = [CLAIMS];
  const walk = (rel: string): void => {
    for (const name of readdirSync(join(demoDir, rel)).sort()) {
      const child = `${rel}/${name}`;
      if (statSync(join(demoDir, child)).isDirectory()) walk(child);
      else out.push(child);
    }
  };
  walk('data');
  return out;
}

function listed(names: string[]): string {
  if (names.length <= 6) return names.join(', ');
  return `${names.slice(0, 5).join(', ')} and ${names.length - 5} more`;
}

/** Copy the demo into opts.folder; returns what was written. Throws an InputError before writing anything. */
export async function writeDemo(opts: DemoOptions): Promise<DemoWritten> {
  const write = opts.write ?? ((t: string) => void process.stdout.write(t));
  const folder = resolve(opts.folder);
  const shown = displayPathFor(folder);
  if (existsSync(folder) && !statSync(folder).isDirectory()) {
    throw new InputError({ file: shown, problem: 'this is a file, and warrant demo writes into a folder', fix: 'Give the name of a new or empty folder; warrant demo creates it' });
  }
  const demoDir = join(packageRoot(), 'demo');
  if (!existsSync(join(demoDir, CLAIMS))) throw new Error(`the demo is missing from the installed package (looked for ${join(demoDir, CLAIMS)})`);
  const files = demoFiles(demoDir);
  const there = files.filter((f) => existsSync(join(folder, ...f.split('/'))));
  const clash = there.find((f) => statSync(join(folder, ...f.split('/'))).isDirectory());
  if (clash !== undefined) {
    throw new InputError({ file: join(shown, clash), problem: 'warrant demo would write a file here, and a folder of that name is in the way', fix: 'Give a new or empty folder' });
  }
  if (there.length > 0 && !opts.force) {
    throw new InputError({
      file: shown,
      found: listed(there),
      problem: `${there.length === 1 ? 'this file is' : 'these files are'} already in the folder, and warrant demo does not overwrite files unless asked`,
      fix: 'Give a new or empty folder, or add --force to replace them with the demo’s (other files in the folder are left alone)',
    });
  }

  // The shipped claims file points editors at the schema beside it in the repository; point it at the installed one.
  const schemaRef = relative(folder, claimsSchemaPath()).split(sep).join('/');
  for (const f of files) {
    const from = join(demoDir, ...f.split('/'));
    const to = join(folder, ...f.split('/'));
    let bytes: Buffer | string = await readFile(from);
    if (f === CLAIMS) bytes = bytes.toString('utf8').replace(SCHEMA_LINE, `# yaml-language-server: $schema=${schemaRef}`);
    try {
      makeFolders(dirname(to));
      writeWhole(to, bytes, { replace: true });
    } catch (e) {
      // A read-only or system folder, a file in the path, a full disk: the user's to fix (files written before stay whole).
      throw writeFailure(e, { file: join(shown, ...f.split('/')) }, 'writing the demo file', dirname(to), 'give warrant demo another folder', displayPathFor) ?? e;
    }
  }
  const dataFiles = files.filter((f) => f !== CLAIMS);
  write(`Demo written to ${shown}: ${CLAIMS} (the claims of an invented students' union) and ${dataFiles.length} data files (${listed(dataFiles)}).\n`);
  if (there.length > 0) write(`Replaced (--force): ${listed(there)}.\n`);
  return { folder, claims: join(folder, CLAIMS), history: join(folder, 'out', CLAIMS.replace(/\.yaml$/, '')), files, replaced: there };
}

/** What to do next, after the files are written and (unless --no-build) the pack is built. */
export function nextSteps(written: DemoWritten, built: boolean): string {
  const inside = displayPathFor(written.folder);
  const go = written.folder === resolve('.') ? '' : `cd ${/^[\w./+-]+$/.test(inside) ? inside : `'${inside.replace(/'/g, `'\\''`)}'`} && `;
  const lines = built
    ? [`Open the pack.pdf named above. To try your own wording, edit ${CLAIMS} and rebuild: ${go}npx warrant build ${CLAIMS}`]
    : [`Build the evidence pack: ${go}npx warrant build ${CLAIMS}`, `It is written to out/${CLAIMS.replace(/\.yaml$/, '')}/latest/pack.pdf inside the folder.`];
  return `${lines.join('\n')}\n`;
}
