/**
 * Hostile and careless inputs (issue 13), each run through the real command (`node bin/warrant.js ...`) in a fresh
 * folder made by the case's own setup below (named pipes, devices, sockets, links and zip bombs cannot live in the
 * repository, so the cases are written here, at run time). For a bad input the checks are those of the catalogue:
 * exit code 2, the exact paragraph on stderr naming the file and the field, nothing on stdout, no stack trace, the
 * case's folder unchanged (no `out`) and the process's TMPDIR empty. Every case, bad or not, must finish within
 * 10 s and 300 MB of peak resident memory: the peak is the child's own getrusage maximum (written on exit by
 * peak-memory.mjs, loaded with --import), and a watcher reading /proc/<pid>/status (VmHWM) every 50 ms stops a case
 * that runs away before it can take the machine with it.
 *
 * The groups follow the issue: it must never hang, never stop with an internal error, and never build from
 * nonsense. Cases marked "cousin" were found while fixing the ones the issue names.
 */
import { spawn, spawnSync, execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import {
  cpSync, existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, readlinkSync, realpathSync, rmSync, symlinkSync, writeFileSync,
} from 'node:fs';
import { createServer, type Server } from 'node:net';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { crc32, deflateRawSync } from 'node:zlib';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { zipParts, type ZipPart } from '../helpers/zip.js';

const root = resolve(import.meta.dirname, '../..');
const fixtures = join(root, 'tests/fixtures/catalogue');
const bin = join(root, 'bin/warrant.js');
const peakHook = join(import.meta.dirname, 'peak-memory.mjs');

/**
 * The bounds every case must keep (issue 13, "Done when"): 10 s and 300 MB. The 10 s hold for the processor time the
 * case uses, and for its wall-clock time scaled by how overloaded the machine is (the 1-minute load average per core,
 * when above 1), so that a busy shared machine does not fail a case that a quiet one runs in a second; a hang uses no
 * processor time but still runs into the wall-clock bound.
 */
const LIMIT_SECONDS = 10;
const LIMIT_MB = 300;
const wallLimit = (): number => LIMIT_SECONDS * Math.max(1, loadavg()[0]! / cpus().length);

type Group = 'never hang' | 'never an internal error' | 'refuse nonsense';

interface Case {
  what: string;
  group: Group;
  /** Found while fixing the cases the issue names. */
  cousin?: true;
  /** Writes the case's files into its (empty) folder. */
  setup: (dir: string) => void;
  /** The command line after `warrant` (default: build claims.yaml --out out). */
  argv?: string[];
  /** The exact stderr of a refused input without its final newline; `<case>` stands for the case's folder. */
  message?: string;
  /** For an input that builds: checks on the run (exit code 0). */
  builds?: (run: Run) => void;
  /** More of the environment (the test hooks of src/history/store.ts). */
  env?: Record<string, string>;
}

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
  dir: string;
  seconds: number;
  /** Processor time (user + system) of the command. */
  cpuSeconds: number;
  /** The wall-clock bound in force when the case ran. */
  wallLimit: number;
  peakMB: number;
  before: Map<string, string>;
  after: Map<string, string>;
  leftInTmp: string[];
}

// ---- what the cases are made of --------------------------------------------------------------------------------

const HEAD = `title: Catalogue case
organisation: Glimmerholt Vale College
data_date: 2026-03-14
`;
const SUMMARY_SOURCE = (file: string, extra = ''): string => `sources:
  results:
    file: ${file}
    shape: summary
    respondents: Respondents
    agree: Agreeing
${extra}`;
const COMPARE = `claims:
  - id: hanes-above-lacina
    claim: Hanes agrees more than Łacina.
    kind: compare
    focus: { Department: Hanes }
    against: { Department: Łacina }
    expect: higher
`;
const CSV = 'Department,Year,Respondents,Agreeing\nHanes,2025,50,30\nŁacina,2025,40,20\nBrithŵyr,2025,30,12\nHanes,2026,52,31\nŁacina,2026,41,19\nBrithŵyr,2026,33,15\n';

/** A summary case: claims.yaml naming data.csv, and the CSV itself. */
function summaryCase(dir: string, claims = HEAD + SUMMARY_SOURCE('data.csv') + COMPARE, csv: string | null = CSV): void {
  writeFileSync(join(dir, 'claims.yaml'), claims);
  if (csv !== null) writeFileSync(join(dir, 'data.csv'), csv);
}

/** Departments and two questions for association claims: rates chosen by hand, different on Q1 and Q2. */
function associationCsv(q1: (i: number) => number, q2: (i: number) => number): string {
  const ds = ['Hanes', 'Łacina', 'Brithŵyr', 'Morva', 'Tallis', 'Brenn', 'Corrow', 'Dunmere'];
  const rows = ds.flatMap((d, i) => [`${d},Q1,100,${q1(i)}`, `${d},Q2,100,${q2(i)}`]);
  return `Department,Question,Respondents,Agreeing\n${rows.join('\n')}\n`;
}
const ASSOCIATION = (y: string): string => `claims:
  - id: q1-with-q2
    claim: Departments that agree more on Q1 agree more on Q2.
    kind: association
    units: Department
    x: { Question: Q1 }
    y: { Question: ${y} }
    expect: positive
`;

const NS = 'http://schemas.openxmlformats.org/spreadsheetml/2006/main';
const RNS = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships';
const SHEET_HEAD = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?><worksheet xmlns="${NS}"><sheetData>`;
const inline = (ref: string, text: string): string => `<c r="${ref}" t="inlineStr"><is><t>${text}</t></is></c>`;
const SHEET_ROWS =
  `<row r="1">${inline('A1', 'Department')}${inline('B1', 'Respondents')}${inline('C1', 'Agreeing')}</row>` +
  `<row r="2">${inline('A2', 'Hanes')}<c r="B2"><v>50</v></c><c r="C2"><v>30</v></c></row>` +
  `<row r="3">${inline('A3', 'Łacina')}<c r="B3"><v>40</v></c><c r="C3"><v>20</v></c></row>`;
const SHEET_TAIL = '</sheetData></worksheet>';

/** The parts of a one-sheet workbook (sheet "Results"), with the sheet part and any shared strings given. */
function workbook(sheet: ZipPart, extra: ZipPart[] = []): ZipPart[] {
  const strings = extra.some((p) => p.name === 'xl/sharedStrings.xml');
  return [
    { name: '[Content_Types].xml', data: Buffer.from('<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/></Types>') },
    { name: '_rels/.rels', data: Buffer.from(`<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/officeDocument" Target="xl/workbook.xml"/></Relationships>`) },
    { name: 'xl/workbook.xml', data: Buffer.from(`<?xml version="1.0" encoding="UTF-8"?><workbook xmlns="${NS}" xmlns:r="${RNS}"><sheets><sheet name="Results" sheetId="1" r:id="rId1"/></sheets></workbook>`) },
    {
      name: 'xl/_rels/workbook.xml.rels',
      data: Buffer.from(
        `<?xml version="1.0" encoding="UTF-8"?><Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="${RNS}/worksheet" Target="worksheets/sheet1.xml"/>${strings ? `<Relationship Id="rId2" Type="${RNS}/sharedStrings" Target="sharedStrings.xml"/>` : ''}</Relationships>`,
      ),
    },
    sheet,
    ...extra,
  ];
}

/** `head`, then `fill` megabytes of spaces, then `tail`, deflated as one stream: a few hundred KB to inflate. */
function bomb(head: string, fillMB: number, tail: string): { bytes: Buffer; crc: number; size: number } {
  const mb = Buffer.alloc(1 << 20, 0x20);
  const whole = Buffer.concat([Buffer.from(head), ...Array.from({ length: fillMB }, () => mb), Buffer.from(tail)]);
  return { bytes: deflateRawSync(whole, { level: 9 }), crc: crc32(whole), size: whole.length };
}

const XLSX_CLAIMS = HEAD + SUMMARY_SOURCE('data.xlsx', '    sheet: Results\n') + COMPARE;

function writeXlsxCase(dir: string, parts: ZipPart[]): void {
  writeFileSync(join(dir, 'claims.yaml'), XLSX_CLAIMS);
  writeFileSync(join(dir, 'data.xlsx'), zipParts(parts));
}

/** A history folder `out` holding one earlier pack, built for real, and the same inputs changed to build again. */
function withEarlierPack(dir: string): string {
  summaryCase(dir);
  execFileSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', 'out', '--quiet'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } });
  const pack = readdirSync(join(dir, 'out')).find((n) => n !== 'latest')!;
  // A second build must differ from the first, or it would reuse the same folder.
  writeFileSync(join(dir, 'data.csv'), CSV.replace('Hanes,2026,52,31', 'Hanes,2026,52,33'));
  return pack;
}

const sockets: Server[] = [];

// ---- the cases ---------------------------------------------------------------------------------------------------

const cases: Case[] = [
  // ---- never hang ----
  {
    what: 'a data file that is a named pipe with no writer',
    group: 'never hang',
    setup: (dir) => {
      summaryCase(dir, undefined, null);
      execFileSync('mkfifo', [join(dir, 'data.csv')]);
    },
    message:
      'claims.yaml:6:11: the data file <case>/data.csv is a named pipe (FIFO), not an ordinary file; warrant reads only ordinary files, since reading from a named pipe (FIFO) could wait for ever or never end (field "file", found "data.csv"). Fix: Save the data file as an ordinary file and give the path of that file.',
  },
  {
    what: 'a claims file that is a named pipe with no writer',
    group: 'never hang',
    setup: (dir) => {
      execFileSync('mkfifo', [join(dir, 'claims.yaml')]);
    },
    message:
      'claims.yaml: the claims file <case>/claims.yaml is a named pipe (FIFO), not an ordinary file; warrant reads only ordinary files, since reading from a named pipe (FIFO) could wait for ever or never end. Fix: Save the claims file as an ordinary file and give the path of that file.',
  },
  {
    what: '/dev/zero given as the data file on the command line',
    group: 'never hang',
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'out', '--data', 'results=/dev/zero'],
    message:
      '/dev/zero: the data file /dev/zero is a device (character special file), not an ordinary file; warrant reads only ordinary files, since reading from a device (character special file) could wait for ever or never end (field "--data results"). Fix: Save the data file as an ordinary file and give the path of that file.',
  },
  {
    what: '/dev/urandom given as the claims file',
    group: 'never hang',
    setup: () => {},
    argv: ['build', '/dev/urandom', '--out', 'out'],
    message:
      '/dev/urandom: the claims file /dev/urandom is a device (character special file), not an ordinary file; warrant reads only ordinary files, since reading from a device (character special file) could wait for ever or never end. Fix: Save the claims file as an ordinary file and give the path of that file.',
  },
  {
    what: 'a workbook whose sheet is a zip bomb (300 MB from a few hundred KB, sizes recorded honestly)',
    group: 'never hang',
    setup: (dir) => writeXlsxCase(dir, workbook({ name: 'xl/worksheets/sheet1.xml', deflated: bomb(SHEET_HEAD + SHEET_ROWS, 300, SHEET_TAIL) })),
    message:
      'data.xlsx: the workbook\'s part xl/worksheets/sheet1.xml is recorded as unpacking to <n> bytes from <n> compressed bytes, more than 100 times its size, which real workbooks never need, so it was not read (it is probably a zip bomb, built to exhaust memory or time) (field "xl/worksheets/sheet1.xml", found "<n> bytes unpacking to <n>"). Fix: Check where the workbook came from; save the data again from a spreadsheet program, or export the sheet as CSV.',
  },
  {
    what: 'a workbook whose sheet is a zip bomb with a lying size in the zip directory',
    group: 'never hang',
    setup: (dir) => {
      const b = bomb(SHEET_HEAD + SHEET_ROWS, 300, SHEET_TAIL);
      writeXlsxCase(dir, workbook({ name: 'xl/worksheets/sheet1.xml', deflated: b, claimedSize: 100 * b.bytes.length }));
    },
    message:
      'data.xlsx: the workbook\'s part xl/worksheets/sheet1.xml unpacked to more than <n> bytes from <n> compressed bytes, more than 100 times its size, which real workbooks never need, so it was not read (it is probably a zip bomb, built to exhaust memory or time) (field "xl/worksheets/sheet1.xml", found "<n> bytes unpacking to more than <n>"). Fix: Check where the workbook came from; save the data again from a spreadsheet program, or export the sheet as CSV.',
  },
  {
    what: 'a link named claims.yaml leading to /dev/zero',
    group: 'never hang',
    cousin: true,
    setup: (dir) => symlinkSync('/dev/zero', join(dir, 'claims.yaml')),
    message:
      'claims.yaml: the claims file <case>/claims.yaml is a device (character special file), not an ordinary file; warrant reads only ordinary files, since reading from a device (character special file) could wait for ever or never end. Fix: Save the claims file as an ordinary file and give the path of that file.',
  },
  {
    what: 'a data file that is a listening Unix socket',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir, undefined, null);
      const server = createServer();
      server.listen(join(dir, 'data.csv'));
      sockets.push(server);
    },
    message:
      'claims.yaml:6:11: the data file <case>/data.csv is a socket, not an ordinary file; warrant reads only ordinary files, since reading from a socket could wait for ever or never end (field "file", found "data.csv"). Fix: Save the data file as an ordinary file and give the path of that file.',
  },
  {
    what: 'a claims file that reports 0 bytes but never ends (/proc/self/pagemap)',
    group: 'never hang',
    cousin: true,
    setup: () => {},
    argv: ['build', '/proc/self/pagemap', '--out', 'out'],
    message:
      '/proc/self/pagemap: the claims file is larger than 1 MB, far more than any set of claims needs (found "more than 1048576 bytes"). Fix: Check that this is the claims file and not a data file; data files belong under sources.',
  },
  {
    what: 'a workbook whose shared strings are a zip bomb with a lying size',
    group: 'never hang',
    cousin: true,
    setup: (dir) =>
      writeXlsxCase(
        dir,
        workbook({ name: 'xl/worksheets/sheet1.xml', data: Buffer.from(SHEET_HEAD + SHEET_ROWS + SHEET_TAIL) }, [
          { name: 'xl/sharedStrings.xml', deflated: bomb(`<?xml version="1.0"?><sst xmlns="${NS}"><si><t>`, 300, '</t></si></sst>'), claimedSize: 2000 },
        ]),
      ),
    message:
      'data.xlsx: The workbook is damaged: its part xl/sharedStrings.xml cannot be unpacked, as it unpacks to more bytes than the zip\'s directory records (a damaged file, or a zip bomb) (field "xl/sharedStrings.xml", found "too many bytes in the stream. expected 2000. got at least <n>"). Fix: Open the workbook in a spreadsheet program and save it again as .xlsx.',
  },
  {
    what: 'a workbook whose zip directory lists 20,000 parts',
    group: 'never hang',
    cousin: true,
    setup: (dir) =>
      writeXlsxCase(dir, [
        ...workbook({ name: 'xl/worksheets/sheet1.xml', data: Buffer.from(SHEET_HEAD + SHEET_ROWS + SHEET_TAIL) }),
        ...Array.from({ length: 20_000 }, (_, i) => ({ name: `xl/media/p${i}.xml`, data: Buffer.from('x') })),
      ]),
    message:
      'data.xlsx: the workbook\'s zip directory lists 20005 parts, more than the 10000 warrant reads through (real workbooks hold tens or hundreds) (found "20005 parts"). Fix: Check that this is the right workbook; save the data again from a spreadsheet program, or export the sheet as CSV.',
  },
  {
    what: 'a 3 GB sparse file of zero bytes named data.csv',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir, undefined, null);
      execFileSync('truncate', ['-s', '3G', join(dir, 'data.csv')]);
    },
    message:
      'data.csv: The file holds a zero byte near its start, which CSV text never does: it is damaged, or a binary file with a .csv name (found "a zero byte (NUL)"). Fix: Open it in a spreadsheet program and save it again as CSV UTF-8, or point the claims file at the right file.',
  },
  {
    what: 'a 200 MB CSV file with no line break',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir, undefined, null);
      writeFileSync(join(dir, 'data.csv'), Buffer.alloc(200 << 20, 0x61));
    },
    message:
      'data.csv, row 1: Row 1 of the file runs on for more than 4 million characters without ending: the file has no line breaks where rows should end, or a quote is never closed (found "more than 4194304 characters"). Fix: Check that this is a CSV file with one row per line; if a value opens a quote, close it with a double quote.',
  },
  {
    what: 'a template in the --templates folder that is a named pipe',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'words'));
      execFileSync('mkfifo', [join(dir, 'words', 'compare.key.mustache')]);
    },
    argv: ['build', 'claims.yaml', '--out', 'out', '--templates', 'words'],
    message:
      'words/compare.key.mustache: the template <case>/words/compare.key.mustache is a named pipe (FIFO), not an ordinary file; warrant reads only ordinary files, since reading from a named pipe (FIFO) could wait for ever or never end (field "--templates"). Fix: Save the template as an ordinary file and give the path of that file.',
  },
  {
    what: '--since naming a pack whose results.json is a named pipe',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'old'));
      execFileSync('mkfifo', [join(dir, 'old', 'results.json')]);
    },
    argv: ['build', 'claims.yaml', '--out', 'out', '--since', 'old'],
    message:
      'old: the pack old cannot be read: the results.json of an earlier pack <case>/old/results.json is a named pipe (FIFO), not an ordinary file; warrant reads only ordinary files, since reading from a named pipe (FIFO) could wait for ever or never end. Fix: Name another pack, or build this one again from its claims file and data.',
  },
  {
    what: '--out inside /proc/self, a folder that exists yet refuses new folders',
    group: 'never hang',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', '/proc/self/packs'],
    message:
      '/proc/self/packs: writing the pack into the history folder failed: the folder /proc/self cannot be written: permission was denied (field "--out"). Fix: Give --out another folder: one of your own, e.g. out.',
  },
  // A folder that cannot be written is said as a write, with a write's fixes: tests run as root, for whom permissions
  // are not enforced, so the file system's own error is thrown where the pack's first file is opened (test hook).
  ...(
    [
      ['EACCES', 'permission was denied', 'Give --out another folder, or change the permissions of packs so that you can write in it (e.g. chmod u+w packs)'],
      ['EPERM', 'permission was denied', 'Give --out another folder, or change the permissions of packs so that you can write in it (e.g. chmod u+w packs)'],
      ['EROFS', 'it is on a read-only file system', 'Give --out another folder, on a disk that can be written'],
      ['ENOSPC', 'there is no space left on its disk', 'Free some space on the disk and run the command again, or give --out another folder on another disk'],
      ['EDQUOT', 'your disk quota is used up', 'Free some space within your quota and run the command again, or give --out another folder on another disk'],
    ] as const
  ).map(([code, why, fix]): Case => ({
    what: `--out a folder that cannot be written (${code})`,
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'packs'));
    },
    argv: ['build', 'claims.yaml', '--out', 'packs'],
    env: { WARRANT_TEST_FAIL_AFTER_FILES: '0', WARRANT_TEST_FAIL_CODE: code },
    message: `packs: writing the pack into the history folder failed: the folder packs cannot be written: ${why} (field "--out"). Fix: ${fix}.`,
  })),
  {
    what: '--out a folder inside the claims file',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'claims.yaml/packs'],
    message:
      'claims.yaml/packs: writing the pack into the history folder failed: a part of the path is a file where a folder was expected (field "--out"). Fix: Check each folder named in the path (one of them is a file), or give --out another folder.',
  },
  {
    what: 'warrant demo into a new folder inside /proc/self',
    group: 'never hang',
    cousin: true,
    setup: () => undefined,
    argv: ['demo', '/proc/self/warrant-demo', '--no-build'],
    message:
      '/proc/self/warrant-demo/claims.yaml: writing the demo file failed: the folder above it takes no new folders or files (a system folder such as /proc or /sys). Fix: Choose a folder of your own to write into, e.g. out.',
  },
  {
    what: '--out a symbolic link that leads to itself through another',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      symlinkSync('loop-b', join(dir, 'loop-a'));
      symlinkSync('loop-a', join(dir, 'loop-b'));
    },
    argv: ['build', 'claims.yaml', '--out', 'loop-a'],
    message:
      'loop-a: writing the pack into the history folder failed: the path goes round a loop of symbolic links (field "--out"). Fix: Check the symbolic links in the path: one leads back to itself.',
  },
  // ---- never an internal error ----
  {
    what: 'an association of a measure with itself',
    group: 'never an internal error',
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + ASSOCIATION('Q1'), associationCsv((i) => 30 + i * 5, (i) => 70 - i * 3)),
    message:
      'claims.yaml:16:8: claim "q1-with-q2" measures the same thing on both axes (x and y select the same answers with the same measure), so it could only find a perfect association (field "y", found "{ Question: Q1 }"). Fix: Select a different question or measure for y than for x.',
  },
  {
    what: 'an association of a measure with itself, found by warrant check',
    group: 'never an internal error',
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + ASSOCIATION('Q1'), associationCsv((i) => 30 + i * 5, (i) => 70 - i * 3)),
    argv: ['check', 'claims.yaml'],
    message:
      'claims.yaml:16:8: claim "q1-with-q2" measures the same thing on both axes (x and y select the same answers with the same measure), so it could only find a perfect association (field "y", found "{ Question: Q1 }"). Fix: Select a different question or measure for y than for x.\n\n1 problem found in claims.yaml.',
  },
  {
    what: '--out a symbolic link to a folder that does not exist',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      symlinkSync('gone', join(dir, 'packs'));
    },
    argv: ['build', 'claims.yaml', '--out', 'packs'],
    message:
      'packs: <case>/packs is a symbolic link to gone, which does not exist, so the history folder cannot be made there (field "--out"). Fix: Make the folder the link leads to, or give --out another folder.',
  },
  {
    what: 'warrant init --out into a folder that does not exist',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['init', 'data.csv', '--out', 'drafts/claims.yaml'],
    message:
      'drafts/claims.yaml: the folder drafts does not exist, so the claims file cannot be written there (field "--out"). Fix: Give --out a file name in a folder that exists (warrant init makes no folders).',
  },
  {
    what: 'warrant init --out naming a folder, with --force',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'drafts'));
    },
    argv: ['init', 'data.csv', '--out', 'drafts', '--force'],
    message:
      'drafts: this is a folder, and warrant init writes a claims file (field "--out"). Fix: Give --out the name of the file to write, e.g. drafts/claims.yaml.',
  },
  {
    what: 'warrant demo into a path through a file',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['demo', 'data.csv/demo', '--no-build'],
    message:
      'data.csv/demo/claims.yaml: writing the demo file failed: a part of the path is a file where a folder was expected. Fix: Check each folder named in the path (one of them is a file), or give warrant demo another folder.',
  },
  {
    what: 'an association whose first measure is the same in every unit: too little data, said in words',
    group: 'never an internal error',
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + ASSOCIATION('Q2'), associationCsv(() => 50, (i) => 30 + i * 5)),
    builds: (run) => {
      const results = packResults(run);
      expect(results.claims[0]?.verdict).toBe('too-little-data');
      expect(packText(run)).toContain('every one of the 8 units has the same value of the first measure');
    },
  },
  {
    what: 'an association where every unit answered alike on both measures',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + ASSOCIATION('Q2'), associationCsv(() => 50, () => 50)),
    builds: (run) => expect(packResults(run).claims[0]?.verdict).toBe('too-little-data'),
  },
  {
    what: 'an association with a perfect fit (Q2 equals Q1 in every unit): tested, not an error',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + ASSOCIATION('Q2'), associationCsv((i) => 30 + i * 5, (i) => 30 + i * 5)),
    // r = 1 exactly: both rates are 0.30 + 0.05 i, a straight line (worked by hand).
    builds: (run) => expect(packResults(run).claims[0]?.verdict).toBe('supported'),
  },
  {
    what: 'latest in the history folder is a real folder',
    group: 'never an internal error',
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'out', 'latest'), { recursive: true });
      writeFileSync(join(dir, 'out', 'latest', 'notes.txt'), 'kept by hand\n');
    },
    message:
      'out/latest: warrant keeps a link named latest in the history folder pointing to the newest pack, but out/latest is a folder, not a link, so it cannot be moved to the new pack (field "--out", found "a folder"). Fix: Move or rename out/latest (e.g. to out/latest-old), then build again; warrant makes the link itself.',
  },
  {
    what: 'latest in the history folder is a file',
    group: 'never an internal error',
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'out'));
      writeFileSync(join(dir, 'out', 'latest'), '2026-01-01-000000000000\n');
    },
    message:
      'out/latest: warrant keeps a link named latest in the history folder pointing to the newest pack, but out/latest is a file, not a link, so it cannot be moved to the new pack (field "--out", found "a file"). Fix: Move or rename out/latest (e.g. to out/latest-old), then build again; warrant makes the link itself.',
  },
  {
    what: 'a history folder name longer than the file system allows',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'x'.repeat(300)],
    message:
      `${'x'.repeat(300)}: writing the pack into the history folder failed: the path, or a name in it, is longer than the file system allows (field "--out"). Fix: Use a shorter path or shorter folder names: give --out another folder with a shorter path.`,
  },
  {
    what: 'a claims file name longer than the file system allows',
    group: 'never an internal error',
    cousin: true,
    setup: () => {},
    argv: ['build', `${'c'.repeat(300)}.yaml`],
    message:
      `${'c'.repeat(300)}.yaml: looking for the claims file failed: the path, or a name in it, is longer than the file system allows. Fix: Use a shorter path or shorter folder and file names.`,
  },
  {
    what: 'warrant diff on a pack whose results.json is valid JSON but not a pack',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      for (const p of ['a', 'b']) {
        mkdirSync(join(dir, p));
        writeFileSync(join(dir, p, 'results.json'), '{}\n');
      }
    },
    argv: ['diff', 'a', 'b'],
    message:
      'a: the pack a cannot be read: its results.json is not one warrant can compare with: its list of claims is missing or damaged. Fix: Name another pack, or build this one again from its claims file and data.',
  },
  {
    what: 'a template that includes another template ({{> name}})',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'words'));
      writeFileSync(join(dir, 'words', 'compare.key.mustache'), '{{focus}} {{> glossary}}\n');
    },
    argv: ['build', 'claims.yaml', '--out', 'out', '--templates', 'words'],
    message:
      'words/compare.key.mustache: the template includes another template, which warrant templates cannot do, so the sentence would have a hole in it (field "{{> glossary}}", found "glossary"). Fix: Write the words out in this template instead of {{> ...}}.',
  },
  // ---- refuse nonsense ----
  {
    what: 'a NUL byte in the claims file',
    group: 'refuse nonsense',
    setup: (dir) => summaryCase(dir, HEAD.replace('Catalogue case', 'Catalogue\u0000case') + SUMMARY_SOURCE('data.csv') + COMPARE),
    message:
      'claims.yaml:1:17: the claims file holds a control character (U+0000, NUL), which YAML does not allow anywhere in a file (found "U+0000"). Fix: Delete the character (most editors do not show it; it often comes from a damaged save or text pasted from another program); inside a double-quoted value, write an escape such as \\t if the character is really meant.',
  },
  {
    what: 'an escape character inside a quoted claim',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('claim: Hanes agrees more than Łacina.', 'claim: "Hanes agrees \u001b[31mmore\u001b[0m than Łacina."')),
    message:
      'claims.yaml:12:26: the claims file holds a control character (U+001B, ESC), which YAML does not allow anywhere in a file (found "U+001B"). Fix: Delete the character (most editors do not show it; it often comes from a damaged save or text pasted from another program); inside a double-quoted value, write an escape such as \\t if the character is really meant.',
  },
  {
    what: 'a crosstab of a column against itself',
    group: 'refuse nonsense',
    setup: (dir) =>
      summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + 'claims:\n  - id: dept-by-dept\n    claim: Department is related to department.\n    kind: crosstab\n    rows: Department\n    columns: Department\n'),
    message:
      'claims.yaml:15:14: claim "dept-by-dept" crosses the column "Department" with itself, so every answer would fall on the table\'s diagonal (field "columns", found "Department"). Fix: Name two different columns under rows and columns.',
  },
  {
    what: 'a summary source whose respondents column is also its agree column',
    group: 'refuse nonsense',
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv').replace('agree: Agreeing', 'agree: Respondents') + COMPARE),
    message:
      'claims.yaml:9:12: source "results" uses the column "Respondents" both as respondents (line 8) and as agree, so every rate would be 100%; each column can play one part only (field "agree", found "Respondents"). Fix: Name the column that holds the number who agreed under agree.',
  },
  {
    what: 'a period column that is also the respondents column',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv', '    period: Respondents\n') + COMPARE),
    message:
      'claims.yaml:10:13: source "results" uses the column "Respondents" both as respondents (line 8) and as period; each column can play one part only (field "period", found "Respondents"). Fix: Name the column that holds the survey period (such as the year) under period.',
  },
  {
    what: 'a compare claim whose focus and against are the same selection',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('against: { Department: Łacina }', 'against: { Department: Hanes }')),
    message:
      'claims.yaml:15:14: claim "hanes-above-lacina" compares a selection with itself (focus and against are the same), so the difference is zero by construction (field "against", found "{ Department: Hanes }"). Fix: Make against the selection the focus is compared with, e.g. another department or the rest of the region.',
  },
  {
    what: '--date 2026-02-30',
    group: 'refuse nonsense',
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'out', '--date', '2026-02-30'],
    message:
      'command line: the date given is not a real date: February 2026 has 28 days (field "--date", found "2026-02-30"). Fix: Give the date shown on the pack as YYYY-MM-DD, e.g. --date 2026-03-14.',
  },
  {
    what: 'data_date 2026-02-29 in the claims file (2026 is not a leap year)',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD.replace('2026-03-14', '2026-02-29') + SUMMARY_SOURCE('data.csv') + COMPARE),
    message:
      'claims.yaml:3:12: 2026-02-29 is not a real date: February 2026 has 28 days (field "data_date", found "2026-02-29"). Fix: Write the date the data describe as YYYY-MM-DD, e.g. 2026-03-14.',
  },
  {
    what: 'an empty --date',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'out', '--date', ''],
    message:
      'command line: the date given is not a real date: it is empty (field "--date", found ""). Fix: Give the date shown on the pack as YYYY-MM-DD, e.g. --date 2026-03-14.',
  },
  {
    what: 'a misspelt template file name in the --templates folder',
    group: 'refuse nonsense',
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'words'));
      writeFileSync(join(dir, 'words', 'compare.not-suported.mustache'), 'Not borne out by the data.\n');
    },
    argv: ['build', 'claims.yaml', '--out', 'out', '--templates', 'words'],
    message:
      'words/compare.not-suported.mustache: no built-in template has this name, so this file would replace nothing and its words would never be used (field "--templates", found "compare.not-suported.mustache"). Fix: Did you mean compare.not-supported.mustache? Rename the file to the name of the template it rewords.',
  },
  {
    what: 'a template naming a variable that does not exist',
    group: 'refuse nonsense',
    setup: (dir) => {
      summaryCase(dir);
      mkdirSync(join(dir, 'words'));
      writeFileSync(join(dir, 'words', 'compare.key.mustache'), '{{focusLabell}} against {{againstLabel}}\n');
    },
    argv: ['build', 'claims.yaml', '--out', 'out', '--templates', 'words'],
    message:
      'words/compare.key.mustache: the template uses a variable that warrant does not give the template compare.key, so the sentence would have a hole in it (field "{{focusLabell}}", found "focusLabell"). Fix: Did you mean {{focus}}? The variables this template can use are <rest>',
  },
  {
    what: 'an earlier pack whose results.json is cut short: the pack and the terminal say so',
    group: 'refuse nonsense',
    setup: (dir) => {
      const pack = withEarlierPack(dir);
      const file = join(dir, 'out', pack, 'results.json');
      writeFileSync(file, readFileSync(file).subarray(0, 500));
    },
    builds: (run) => {
      expect(run.stderr).toMatch(/^warrant: The latest earlier pack, \d{4}-\d\d-\d\d-[0-9a-f]{12}, could not be read \(its results\.json is cut short or damaged/);
      expect(packText(run)).toContain('What changed: not known');
      expect(packText(run)).toMatch(/could not be read: its results\.json is cut short or damaged/);
    },
  },
  {
    what: 'an earlier pack whose results.json is valid JSON but not a pack',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      const pack = withEarlierPack(dir);
      writeFileSync(join(dir, 'out', pack, 'results.json'), '[]\n');
    },
    builds: (run) => {
      expect(run.stderr).toMatch(/could not be read \(its results\.json is not one warrant can compare with: it does not hold a JSON object\)/);
      expect(packText(run)).toContain('What changed: not known');
    },
  },
  {
    what: 'a data path outside the claims folder: read, and its resolved path shown on the reproducibility page',
    group: 'refuse nonsense',
    setup: (dir) => {
      mkdirSync(join(dir, 'claims'));
      mkdirSync(join(dir, 'elsewhere'));
      writeFileSync(join(dir, 'elsewhere', 'data.csv'), CSV);
      writeFileSync(join(dir, 'claims', 'claims.yaml'), HEAD + SUMMARY_SOURCE('../elsewhere/data.csv') + COMPARE);
    },
    argv: ['build', 'claims/claims.yaml', '--out', 'out'],
    builds: (run) => {
      // pdftotext breaks a long path across lines: compared without spaces.
      expect(packText(run).replace(/\s/g, '')).toContain(`outsidetheclaimsfile'sfolder:readfrom${join(run.dir, 'elsewhere', 'data.csv')}`.replace(/\s/g, ''));
    },
  },
  {
    what: 'names in the data in decomposed Unicode match the claims file (NFC on both sides)',
    group: 'refuse nonsense',
    setup: (dir) => summaryCase(dir, undefined, CSV.normalize('NFD')),
    // From CSV: Hanes 50 + 52 answered, 30 + 31 agreed; Łacina 40 + 41 and 20 + 19 (pooled over the two years).
    builds: (run) => {
      const sel = packResults(run).claims[0]?.selections.map((s) => [s.label, s.n, s.agree]);
      expect(sel).toEqual([
        ['Hanes', 102, 61],
        ['Łacina', 81, 39],
      ]);
    },
  },
  {
    what: 'two header columns whose names differ only in Unicode form',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) =>
      summaryCase(
        dir,
        undefined,
        CSV.split('\n')
          .map((l, i) => (i === 0 ? `${l},Notés,Note\u0301s` : l === '' ? l : `${l},a,b`))
          .join('\n'),
      ),
    message:
      'data.csv, row 1: Two columns have the same name (columns 5 and 6), written in different Unicode forms (one with accents as separate combining marks) (field "Note\u0301s", found "Note\u0301s"). Fix: Give each column a different name in the header row.',
  },
  {
    what: 'a value typed with a non-breaking space: the message says it differs only in Unicode form',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('against: { Department: Łacina }', 'against: { Department: "Brithŵyr\u00a0Vale" }'), CSV.replaceAll('Brithŵyr', 'Brithŵyr Vale')),
    message:
      'claims.yaml:15:28: no row of source "results" has this value in column "Department", in claim "hanes-above-lacina" (field "Department", found "Brithŵyr\u00a0Vale"). Fix: Did you mean "Brithŵyr Vale"? They look the same but differ in their Unicode form (special spaces, invisible characters, ligatures or full-width letters): retype the name. The values of "Department" found are "Hanes", "Łacina", "Brithŵyr Vale".',
  },
  {
    what: 'a count of 1e300 respondents, a whole number to JavaScript',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, undefined, CSV.replace('Hanes,2025,50,30', 'Hanes,2025,1e300,30')),
    message:
      'data.csv, row 2: A count is larger than any survey could hold (more than 10,000,000,000 people, more than live on Earth) (field "Respondents", found "1e300"). Fix: Check the cell: it may hold another figure (an ID, a sum of money, a date); write the number of people as digits.',
  },
  {
    what: 'a workbook count beyond the whole numbers a double holds',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => writeXlsxCase(dir, workbook({ name: 'xl/worksheets/sheet1.xml', data: Buffer.from(SHEET_HEAD + SHEET_ROWS.replace('<c r="B3"><v>40</v></c><c r="C3"><v>20</v></c>', '<c r="B3"><v>1E+23</v></c><c r="C3"><v>99999999999999991611392</v></c>') + SHEET_TAIL) })),
    message:
      'data.xlsx, sheet "Results", row 3: A count is larger than any survey could hold (more than 10,000,000,000 people, more than live on Earth) (field "Respondents", found "1e+23"). Fix: Check the cell: it may hold another figure (an ID, a sum of money, a date); write the number of people as digits.\n\n' +
      'data.xlsx, sheet "Results", row 3: A count is larger than any survey could hold (more than 10,000,000,000 people, more than live on Earth) (field "Agreeing", found "1e+23"). Fix: Check the cell: it may hold another figure (an ID, a sum of money, a date); write the number of people as digits.',
  },
  {
    what: 'a numeric column holding 1e306, whose squares overflow',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      const rows = ['Hanes', 'Łacina', 'Brithŵyr', 'Morva', 'Tallis', 'Brenn'].map((d, i) => `${d},Q1,100,${40 + 3 * i},${i === 2 ? '1e306' : 10 + i}`);
      writeFileSync(join(dir, 'data.csv'), `Department,Question,Respondents,Agreeing,Ratio\n${rows.join('\n')}\n`);
      writeFileSync(
        join(dir, 'claims.yaml'),
        HEAD + SUMMARY_SOURCE('data.csv', '    numeric: [Ratio]\n') +
          'claims:\n  - id: ratio-with-agree\n    claim: Departments with more staff per student agree more.\n    kind: association\n    units: Department\n    x: { Question: Q1 }\n    x_measure: { column: Ratio }\n    y: { Question: Q1 }\n    expect: positive\n',
      );
    },
    message:
      'data.csv, row 4: A value in a numeric column is too large to compute with (more than 10^15, a thousand million million, in size) (field "Ratio", found "1e306"). Fix: Check the cell: it may hold another figure (an ID, a number in the wrong unit); write the value the column measures, or leave the cell blank where there is none.',
  },
  // A field of the wrong shape is said at its line, as that field, with what was found and the form meant.
  ...(
    [
      [
        'an association claim measuring a numeric column with x: { column: Ratio } (x selects rows; x_measure measures)',
        '    x: { column: Ratio }\n    y: { Question: Q1 }\n',
        'claims.yaml:16:10: x in claim "ratio-with-agree" selects rows by the values of their columns, and the data of source "results" have no column "column"; { column: Ratio } is how a measure is written (field "x", found "{ column: Ratio }"). Fix: To measure the numeric column Ratio, write x_measure: { column: Ratio } beside x, and let x select the rows it is measured on, e.g. x: { Question: ... }.',
      ],
      [
        'an association claim with x_measure: { col: Ratio }',
        '    x: { Question: Q1 }\n    x_measure: { col: Ratio }\n    y: { Question: Q1 }\n',
        'claims.yaml:17:16: "x_measure" in claim "ratio-with-agree" is not a measure warrant knows (field "x_measure", found "{ col: Ratio }"). Fix: Ratio is a numeric column of the source: write x_measure: { column: Ratio }.',
      ],
      [
        'an association claim with y_measure: Ratio, a numeric column named bare',
        '    x: { Question: Q1 }\n    y: { Question: Q1 }\n    y_measure: Ratio\n',
        'claims.yaml:18:16: "y_measure" in claim "ratio-with-agree" is not a measure warrant knows (field "y_measure", found "Ratio"). Fix: Ratio is a numeric column of the source: write y_measure: { column: Ratio }.',
      ],
    ] as const
  ).map(([what, fields, message]): Case => ({
    what,
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      const rows = ['Hanes', 'Łacina', 'Brithŵyr', 'Morva', 'Tallis', 'Brenn'].map((d, i) => `${d},Q1,100,${40 + 3 * i},${10 + ((i * 7) % 5)}`);
      writeFileSync(join(dir, 'data.csv'), `Department,Question,Respondents,Agreeing,Ratio\n${rows.join('\n')}\n`);
      writeFileSync(
        join(dir, 'claims.yaml'),
        HEAD + SUMMARY_SOURCE('data.csv', '    numeric: [Ratio]\n') +
          `claims:\n  - id: ratio-with-agree\n    claim: Departments with more staff per student agree more.\n    kind: association\n    units: Department\n${fields}    expect: positive\n`,
      );
    },
    message,
  })),
  {
    what: 'a compare claim selecting with focus: { column: Ratio }',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      writeFileSync(join(dir, 'data.csv'), 'Department,Respondents,Agreeing,Ratio\nHanes,50,30,12\nŁacina,40,20,14\n');
      writeFileSync(
        join(dir, 'claims.yaml'),
        HEAD + SUMMARY_SOURCE('data.csv', '    numeric: [Ratio]\n') +
          'claims:\n  - id: hanes-above-lacina\n    claim: Hanes agrees more than Łacina.\n    kind: compare\n    focus: { column: Ratio }\n    against: { Department: Łacina }\n    expect: higher\n',
      );
    },
    message:
      'claims.yaml:15:14: focus in claim "hanes-above-lacina" selects rows by the values of their columns, and the data of source "results" have no column "column"; { column: Ratio } is how a measure is written (field "focus", found "{ column: Ratio }"). Fix: A compare claim measures agreement; a numeric column such as Ratio can be measured by an association claim (x_measure: { column: Ratio }) or a means claim (measure: { column: Ratio }). Here, select rows by a column of the data (use one of the columns found: "Department").',
  },
  {
    what: 'a claims file nesting 100,000 brackets',
    group: 'never hang',
    cousin: true,
    setup: (dir) => summaryCase(dir, `${HEAD}${SUMMARY_SOURCE('data.csv')}claims: ${'['.repeat(100_000)}${']'.repeat(100_000)}\n`),
    message:
      'claims.yaml:10:209: the file nests brackets or lists too deeply to be read (found "more than 200 levels of [ or {"). Fix: Write the claims file as plain keys and lists, nested a few levels at most.',
  },
  {
    what: 'a claim id 10,000 characters long (it names the claim\'s chart files)',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('id: hanes-above-lacina', `id: ${'h'.repeat(10_000)}`)),
    message: `claims.yaml:11:9: the claim id is 10000 characters long; a claim's id names its chart files in the pack (charts/<id>.svg), and a file's name may be at most 255 bytes on most disks (field "id", found "${'h'.repeat(40)}… (10000 characters)"). Fix: Give the claim a short id, at most 120 characters, e.g. ${'h'.repeat(24)}.`,
  },
  {
    what: 'a group name of 5,000 characters selected in the claims file',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      const long = 'Z'.repeat(5000);
      summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('{ Department: Hanes }', `{ Department: ${long} }`), CSV.replaceAll('Hanes', long));
    },
    message: `claims.yaml:14:26: the value selected in Department is 5000 characters long, longer than any name of a group warrant reads (at most 400 characters) (field "Department", found "${'Z'.repeat(40)}… (5000 characters)"). Fix: Check the value: it may be a paragraph pasted by mistake. Write the name of the group as the data give it in Department.`,
  },
  {
    what: 'group names made of regular-expression characters: read as themselves',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      const meta = '(a+)+$[.*?]{2}|^\\\\d';
      summaryCase(
        dir,
        HEAD + SUMMARY_SOURCE('data.csv') + COMPARE.replace('{ Department: Hanes }', `{ Department: '${meta}' }`),
        CSV.replaceAll('Hanes', `"${meta}"`),
      );
    },
    builds: (run) => {
      const results = packResults(run);
      // No period column: both years pooled, by hand from the CSV (50 + 52 answering, 30 + 31 agreeing; 40 + 41, 20 + 19).
      expect(results.claims[0]?.selections.map((s) => [s.label, s.n, s.agree])).toEqual([
        ['(a+)+$[.*?]{2}|^\\\\d', 102, 61],
        ['Łacina', 81, 39],
      ]);
    },
  },
  {
    what: 'a CSV header of 600,000 columns',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      const cols = Array.from({ length: 600_000 }, (_, i) => `C${i}`).join(',');
      summaryCase(dir, undefined, `Department,Year,Respondents,Agreeing,${cols}\nHanes,2025,50,30\n`);
    },
    message:
      'data.csv, row 1: Row 1 of the file has more than <n> thousand columns in its first 4 million characters, and runs on beyond them; warrant reads rows of at most 4 million characters (found "more than <n> thousand columns"). Fix: Save the table with only the columns the claims use and the columns that describe each row (a survey table has at most a few thousand columns).',
  },
  ...(
    [
      ['the data file', 'data.csv', 'this is a file'],
      ['the claims file', 'claims.yaml', 'this is a file'],
      ['/dev/null', '/dev/null', 'this is a device (character special file)'],
    ] as const
  ).map(([what, out, kind]): Case => ({
    what: `--out naming ${what}: refused, and the file left as it was`,
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', out],
    message: `${out}: ${kind}, not a history folder for packs (field "--out"). Fix: Give --out a folder (new or used before for packs of this claims file).`,
  })),
  {
    what: 'sixty copies of one compare claim: each page names three of the others and counts the rest',
    group: 'never hang',
    cousin: true,
    // Every claim named every other claim on its data, one row each: the pack grew as the square of the claims
    // (300 copies: 3,932 pages; 1,000: 285 s and 3.8 GB; 3,000, a 570 KB claims file: stopped after 4 GB).
    setup: (dir) => {
      const claim = (i: number): string => `  - id: copy-${i}\n    claim: Hanes agrees more than Łacina.\n    kind: compare\n    where: { Year: 2026 }\n    focus: { Department: Hanes }\n    against: { Department: Łacina }\n    expect: higher\n`;
      summaryCase(dir, HEAD + SUMMARY_SOURCE('data.csv') + 'claims:\n' + Array.from({ length: 60 }, (_, i) => claim(i)).join(''));
    },
    builds: (run) => {
      const claims = packResults(run).claims as unknown as Array<{ id: string; linkedClaims: string[]; linkedClaimsMore?: number }>;
      expect(claims).toHaveLength(60);
      expect(claims[0]!.linkedClaims).toEqual(['copy-1', 'copy-2', 'copy-3']);
      expect(claims[2]!.linkedClaims).toEqual(['copy-0', 'copy-1', 'copy-3']);
      expect(claims.every((c) => c.linkedClaims.length === 3 && c.linkedClaimsMore === 56)).toBe(true);
      const text = packText(run);
      expect(text.match(/56 more claims test the same data; the summary shows their verdicts\. Read them together\./g)).toHaveLength(60);
      expect(text.match(/Claim copy-\d+ tests the same data/g)).toHaveLength(180);
    },
  },
  {
    what: 'a claims file saved as UTF-16 with its byte-order mark',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      writeFileSync(join(dir, 'claims.yaml'), Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(HEAD + SUMMARY_SOURCE('data.csv') + COMPARE, 'utf16le')]));
    },
    message:
      'claims.yaml:1:1: the claims file is UTF-16 text (often saved as "Unicode" or "Unicode text"), and warrant reads claims files in UTF-8. Fix: Save it again as UTF-8 in your text editor.',
  },
  {
    what: 'a claims file saved as UTF-16 without a byte-order mark',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      // Big-endian, as some editors save "Unicode (big-endian)": a zero byte before each ASCII letter.
      writeFileSync(join(dir, 'claims.yaml'), Buffer.from(HEAD + SUMMARY_SOURCE('data.csv') + COMPARE, 'utf16le').swap16());
    },
    message:
      'claims.yaml:1:1: the claims file is UTF-16 text (often saved as "Unicode" or "Unicode text"), and warrant reads claims files in UTF-8. Fix: Save it again as UTF-8 in your text editor.',
  },
  {
    what: 'a count column holding percentages',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => summaryCase(dir, undefined, CSV.replace('Hanes,2025,50,30', 'Hanes,2025,50,60%')),
    message:
      'data.csv, row 2: A count is written as a percentage (field "Agreeing", found "60%"). Fix: If this column gives the percent agreeing, name it with agree_percent instead of agree in the source (respondents stays the number who answered); otherwise write the number of people as digits.',
  },
  {
    what: 'a data file that is a loop of symbolic links',
    group: 'never hang',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir, HEAD + SUMMARY_SOURCE('loop-a.csv') + COMPARE, null);
      symlinkSync('loop-b.csv', join(dir, 'loop-a.csv'));
      symlinkSync('loop-a.csv', join(dir, 'loop-b.csv'));
    },
    message:
      'claims.yaml:6:11: the data file <case>/loop-a.csv cannot be opened: the path goes round a loop of symbolic links (field "file", found "loop-a.csv"). Fix: Check the symbolic links in the path: one leads back to itself; point file at the data file itself.',
  },
  {
    what: '--data naming a file inside a file',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['build', 'claims.yaml', '--out', 'out', '--data', 'results=data.csv/2026.csv'],
    message:
      'data.csv/2026.csv: opening the data file given on the command line failed: a part of the path is a file where a folder was expected (field "--data results"). Fix: Check each folder named in the path: one of them is a file.',
  },
  {
    what: 'warrant init on a data path inside a file',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => summaryCase(dir),
    argv: ['init', 'data.csv/2026.csv', '--out', 'starter.yaml'],
    message:
      'data.csv/2026.csv: opening the data file failed: a part of the path is a file where a folder was expected. Fix: Check each folder named in the path: one of them is a file.',
  },
  {
    what: 'warrant init on a workbook that is a loop of symbolic links',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      symlinkSync('loop-b.xlsx', join(dir, 'loop-a.xlsx'));
      symlinkSync('loop-a.xlsx', join(dir, 'loop-b.xlsx'));
    },
    argv: ['init', 'loop-a.xlsx', '--out', 'starter.yaml'],
    message:
      'loop-a.xlsx: opening the data file failed: the path goes round a loop of symbolic links. Fix: Check the symbolic links in the path: one leads back to itself.',
  },
  {
    what: 'an earlier pack of the same inputs half there (its pack.pdf deleted): written again, not called unchanged',
    group: 'never an internal error',
    cousin: true,
    setup: (dir) => {
      summaryCase(dir);
      execFileSync(process.execPath, [bin, 'build', 'claims.yaml', '--out', 'out', '--quiet'], { cwd: dir, env: { ...process.env, NO_COLOR: '1' } });
      const pack = readdirSync(join(dir, 'out')).find((n) => n !== 'latest')!;
      rmSync(join(dir, 'out', pack, 'pack.pdf'));
    },
    builds: (run) => {
      expect(run.stdout).toMatch(/^Evidence pack written: out\/\d{4}-\d{2}-\d{2}-[0-9a-f]{12}\/pack\.pdf$/m);
      expect(packText(run)).toContain('Hanes agrees more than Łacina.');
    },
  },
  {
    what: 'warrant init on a folder whose name ends in .csv',
    group: 'refuse nonsense',
    cousin: true,
    setup: (dir) => mkdirSync(join(dir, 'results.csv')),
    argv: ['init', 'results.csv', '--out', 'starter.yaml'],
    message: 'results.csv: the data file <case>/results.csv is a folder, not a file. Fix: Give the path of the data file itself, inside the folder.',
  },
];

// ---- running ---------------------------------------------------------------------------------------------------------

const work = realpathSync(mkdtempSync(join(tmpdir(), 'warrant-hostile-')));
const runs = new Map<string, Run>();
let wall = 0;

/** Every entry under dir with its kind, size and SHA-256 (pipes, devices, sockets and links named, never opened). */
function snapshot(dir: string): Map<string, string> {
  const out = new Map<string, string>();
  const walk = (d: string): void => {
    for (const name of readdirSync(d).sort()) {
      const p = join(d, name);
      const st = lstatSync(p);
      const rel = relative(dir, p);
      if (st.isSymbolicLink()) out.set(rel, `link ${readlinkSync(p)}`);
      else if (st.isDirectory()) {
        out.set(`${rel}/`, 'folder');
        walk(p);
      } else if (st.isFile()) out.set(rel, `${st.size} ${st.size > 64 << 20 ? 'large' : createHash('sha256').update(readFileSync(p)).digest('hex')}`);
      else out.set(rel, 'special');
    }
  };
  walk(dir);
  return out;
}

/** Peak resident memory so far of a running process, in MB (VmHWM), or 0 when it has gone. */
function vmHwmMB(pid: number): number {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : 0;
  } catch {
    return 0;
  }
}

function runCase(c: Case, i: number): Promise<Run> {
  const base = join(work, String(i).padStart(2, '0'));
  const dir = join(base, 'case');
  const tmp = join(base, 'tmp');
  const peakFile = join(base, 'peak');
  mkdirSync(dir, { recursive: true });
  mkdirSync(tmp);
  c.setup(dir);
  const before = snapshot(dir);
  const argv = c.argv ?? ['build', 'claims.yaml', '--out', 'out'];
  return new Promise((done) => {
    const started = performance.now();
    const child = spawn(process.execPath, ['--import', peakHook, bin, ...argv], {
      cwd: dir,
      env: { ...process.env, TMPDIR: tmp, TMP: tmp, TEMP: tmp, NO_COLOR: '1', CATALOGUE_PEAK_FILE: peakFile, ...c.env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const out: Buffer[] = [];
    const err: Buffer[] = [];
    child.stdout.on('data', (b: Buffer) => out.push(b));
    child.stderr.on('data', (b: Buffer) => err.push(b));
    let watched = 0;
    const limit = wallLimit();
    // A case over the bounds is stopped before it could harm the machine; the assertions then fail it.
    const watch = setInterval(() => {
      watched = Math.max(watched, vmHwmMB(child.pid!));
      if (watched > 2 * LIMIT_MB || performance.now() - started > 2 * limit * 1000) child.kill('SIGKILL');
    }, 50);
    child.on('close', (code) => {
      clearInterval(watch);
      const seconds = (performance.now() - started) / 1000;
      const peak = existsSync(peakFile) ? (JSON.parse(readFileSync(peakFile, 'utf8')) as { hwmKB: number; cpuSeconds: number }) : { hwmKB: 0, cpuSeconds: seconds };
      done({
        code,
        stdout: Buffer.concat(out).toString('utf8'),
        stderr: Buffer.concat(err).toString('utf8'),
        dir,
        seconds,
        cpuSeconds: peak.cpuSeconds,
        wallLimit: limit,
        peakMB: Math.max(peak.hwmKB / 1024, watched),
        before,
        after: snapshot(dir),
        leftInTmp: readdirSync(tmp),
      });
    });
  });
}

function packFolder(run: Run): string {
  const out = join(run.dir, 'out');
  const latest = realpathSync(join(out, 'latest'));
  return latest;
}

function packResults(run: Run): { claims: Array<{ verdict: string; selections: Array<{ label: string; n: number; agree: number }> }> } {
  return JSON.parse(readFileSync(join(packFolder(run), 'results.json'), 'utf8'));
}

/** The pack's text read back with poppler's pdftotext (independent of the library that wrote it), spaces joined. */
function packText(run: Run): string {
  return execFileSync('pdftotext', ['-enc', 'UTF-8', join(packFolder(run), 'pack.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}

beforeAll(async () => {
  const started = performance.now();
  // The real command runs dist/: compile when a source file is newer (as the catalogue does), then join the modules
  // (scripts/bundle.mjs), which bin/warrant.js runs as an installed warrant does.
  execFileSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', root], { stdio: 'pipe' });
  execFileSync(process.execPath, [join(root, 'scripts/bundle.mjs')], { stdio: 'pipe' });
  let next = 0;
  // HOSTILE_ONLY=text runs only the cases whose name contains it (while working on one); the others then fail.
  const only = process.env.HOSTILE_ONLY;
  const chosen = cases.map((c, i) => [c, i] as const).filter(([c]) => only === undefined || c.what.includes(only));
  const worker = async (): Promise<void> => {
    while (next < chosen.length) {
      const [c, i] = chosen[next++]!;
      runs.set(c.what, await runCase(c, i));
    }
  };
  await Promise.all([worker(), worker()]);
  wall = (performance.now() - started) / 1000;
}, 1_200_000);

afterAll(() => {
  for (const s of sockets) s.close();
  const slowest = [...runs.entries()].sort((a, b) => b[1].seconds - a[1].seconds)[0];
  const largest = [...runs.entries()].sort((a, b) => b[1].peakMB - a[1].peakMB)[0];
  console.info(
    `Hostile inputs: ${cases.length} cases (${cases.filter((c) => c.cousin).length} cousins) in ${wall.toFixed(1)} s; ` +
      `slowest ${slowest?.[1].seconds.toFixed(2)} s wall, ${slowest?.[1].cpuSeconds.toFixed(2)} s processor (${slowest?.[0]}), largest peak ${largest?.[1].peakMB.toFixed(0)} MB (${largest?.[0]})`,
  );
  if (process.env.HOSTILE_REPORT) {
    for (const [what, r] of runs) console.info(`${r.seconds.toFixed(2)} s (cpu ${r.cpuSeconds.toFixed(2)} s) ${r.peakMB.toFixed(0)} MB exit ${r.code}: ${what}\n  ${r.stderr.replaceAll(r.dir, '<case>').trim()}`);
  }
  rmSync(work, { recursive: true, force: true });
});

describe('output read by a program that stops early', () => {
  it('warrant build | head -c 0: exit code 0, no stack trace, the pack written', () => {
    const dir = join(work, 'pipe-closed');
    mkdirSync(dir, { recursive: true });
    summaryCase(dir);
    // head has left long before the build prints (it reads nothing), so the build's first line meets a closed pipe
    // (EPIPE), which was an unhandled 'error' event: a stack trace and exit code 1 after the pack was written.
    const r = spawnSync('bash', ['-c', `set -o pipefail; "${process.execPath}" "${bin}" build claims.yaml --out out | head -c 0`], { cwd: dir, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
    expect(r.stderr).not.toMatch(/EPIPE|^\s+at /m);
    expect(r.status).toBe(0);
    expect(existsSync(join(dir, 'out', 'latest', 'pack.pdf'))).toBe(true);
  });
});

describe('hostile and careless inputs, through the real command', () => {
  it('holds each case the issue names and at least two cousins per group, each named once', () => {
    expect(new Set(cases.map((c) => c.what)).size).toBe(cases.length);
    for (const g of ['never hang', 'never an internal error', 'refuse nonsense'] as Group[]) {
      expect(cases.filter((c) => c.group === g && c.cousin).length, g).toBeGreaterThanOrEqual(2);
    }
  });

  for (const c of cases) {
    it(`${c.group}: ${c.what}${c.cousin ? ' (cousin)' : ''}`, () => {
      const run = runs.get(c.what)!;
      expect(run.cpuSeconds, 'processor seconds').toBeLessThanOrEqual(LIMIT_SECONDS);
      expect(run.seconds, `wall-clock seconds (bound ${run.wallLimit.toFixed(1)} s at this load)`).toBeLessThanOrEqual(run.wallLimit);
      expect(run.peakMB, 'peak MB').toBeLessThanOrEqual(LIMIT_MB);
      expect(run.stderr).not.toMatch(/^\s+at /m);
      expect(run.stderr).not.toMatch(/internal error|bug in warrant/);
      expect(run.leftInTmp).toEqual([]);
      if (c.builds) {
        expect(run.code, run.stderr).toBe(0);
        c.builds(run);
        return;
      }
      // `warrant check` lists its problems on stdout; the other commands say them on stderr with nothing on stdout.
      const said = c.argv?.[0] === 'check' ? run.stdout + run.stderr : run.stderr;
      if (c.argv?.[0] !== 'check') expect(run.stdout).toBe('');
      const expected = `${(c.message ?? '').replaceAll('<case>', run.dir)}\n`;
      // <n> stands for a byte count that depends on the zlib build (the size a zip bomb deflates to);
      // <rest> stands for the list of a template's variables, which grows as templates are given more to say.
      if (expected.includes('<n>') || expected.includes('<rest>')) {
        const esc = (x: string): string => x.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
        expect(said).toMatch(new RegExp(`^${expected.split('<rest>').map((part) => part.split('<n>').map(esc).join('\\d+')).join('.*\\{\\{focus\\}\\}.*')}$`, 's'));
      }
      else expect(said).toBe(expected);
      expect(run.code).toBe(2);
      expect([...run.after.entries()]).toEqual([...run.before.entries()]);
    });
  }
});
