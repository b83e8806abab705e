/**
 * The catalogue of bad inputs, run through the real command (issue 7): each case is a folder in
 * tests/fixtures/catalogue/ (written by make-cases.mjs beside it) holding a claims file and its data, copied to a
 * fresh temporary folder and built there with `node bin/warrant.js build claims.yaml --out out` (or the command line
 * a case gives). For a bad input the checks are: exit code 2, the exact paragraph on stderr (file, line or row,
 * field, what was found, a fix), nothing on stdout, no stack trace, and nothing written: the case's folder is the
 * same file for file and byte for byte afterwards (so no `out` folder and no half-written pack), and the process's
 * own temporary folder (TMPDIR) is still empty. A few doubtful inputs build: for those, exit code 0 and what the
 * pack's results.json says was read, worked by hand from the fixture's text.
 *
 * Every case is a real process, run a few at a time; the catalogue's running time is printed at the end.
 */
import { execFile, execFileSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, realpathSync, rmSync, statSync } from 'node:fs';
import { cpus, tmpdir } from 'node:os';
import { join, relative, resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';

const root = resolve(import.meta.dirname, '../..');
const fixtures = join(root, 'tests/fixtures/catalogue');
const bin = join(root, 'bin/warrant.js');

interface Case {
  /** What the case is, as the test is named. */
  what: string;
  /** Folder under tests/fixtures/catalogue. */
  folder: string;
  /** The command line after `warrant` (default: build claims.yaml --out out). */
  argv?: string[];
  /** The exact stderr, without its final newline; `<case>` stands for the case's folder (absolute). */
  message: string;
}

const BUILD = ['build', 'claims.yaml', '--out', 'out'];
const withBuild = (...more: string[]): string[] => [...BUILD, ...more];

// The messages are warrant's own wording: each was read and judged to name the file, the place, the field, what
// was found and a fix. A change of wording shows up here as a failing case, to be read again.
const failures: Case[] = [
  // ---- claims file ------------------------------------------------------------------------------------------------
  {
    what: 'YAML syntax error: a quote never closed',
    folder: 'claims-yaml-syntax',
    message: 'claims.yaml:1:8: a double quote opened here is never closed. Fix: Add the closing " at the end of the value.',
  },
  {
    what: 'YAML syntax error: a key indented too far',
    folder: 'claims-bad-indent',
    message:
      'claims.yaml:6:11: this line is indented as if it belonged to the key before it, but that key already has a value on its own line (the YAML reader says: Nested mappings are not allowed in compact mappings). Fix: Line the key up with the one above it, or move the value of the key above onto lines of its own.',
  },
  {
    what: 'YAML syntax error: a tab used for indenting',
    folder: 'claims-tab-indent',
    message: 'claims.yaml:7:1: a tab is used for indenting, which YAML does not allow (the YAML reader says: Tabs are not allowed as indentation). Fix: Indent with spaces only (two per level is usual).',
  },
  {
    what: 'unknown claim kind',
    folder: 'claims-unknown-kind',
    message:
      'claims.yaml:13:11: "comparison" is not an allowed value of kind in claim "hanes-above-lacina" (field "kind", found "comparison"). Fix: Did you mean compare (two selections\' rates)? Write kind: compare.',
  },
  {
    what: 'missing field (against, in a compare claim)',
    folder: 'claims-missing-field',
    message:
      'claims.yaml:11:5: claim "hanes-above-lacina" has no "against", which is required for a compare claim (field "against"). Fix: Add against: { region: Glimmerholt Vale } naming the selection it is compared with.',
  },
  {
    what: 'mistyped key (againts), reported with the required key it leaves missing',
    folder: 'claims-misspelt-key',
    message: [
      'claims.yaml:11:5: claim "hanes-above-lacina" has no "against", which is required for a compare claim (field "against"). Fix: Add against: { region: Glimmerholt Vale } naming the selection it is compared with.',
      'claims.yaml:15:5: "againts" is not a key warrant knows in claim "hanes-above-lacina" (field "againts"). Fix: Did you mean "against"? Rename the key to against.',
    ].join('\n\n'),
  },
  {
    what: 'mistyped value: text where a whole number belongs',
    folder: 'claims-mistyped-value',
    message: 'claims.yaml:4:18: "min_respondents" should be a whole number (field "min_respondents", found "ten"). Fix: Write a whole number without quotes, e.g. 10.',
  },
  {
    what: 'mistyped value: a misspelt choice, with the nearest suggested',
    folder: 'claims-mistyped-enum',
    message:
      'claims.yaml:16:13: "hgher" is not an allowed value of expect for a compare claim in claim "hanes-above-lacina" (field "expect", found "hgher"). Fix: Use one of: lower, higher, different (did you mean higher?).',
  },
  {
    what: 'confidence 1.5 rejected',
    folder: 'confidence-1.5',
    message:
      'claims.yaml:4:13: the confidence level 1.5 is read as 1.5%, outside the accepted range (above 50% and at most 99.9%) (field "confidence", found "1.5"). Fix: Write it as 0.95, 95 or "95%"; any level above 50% and up to 99.9% is accepted.',
  },
  {
    what: 'duplicated claim ids',
    folder: 'claims-duplicate-id',
    message:
      'claims.yaml:17:9: the claim id "hanes-above-lacina" is used twice: here (line 17) and at line 11, column 9 (field "id", found "hanes-above-lacina"). Fix: Give each claim its own id, e.g. by adding a year or a place to one of them.',
  },
  {
    what: 'a data path that does not exist',
    folder: 'data-path-missing',
    message:
      'claims.yaml:6:11: the data file was not found at <case>/data/summary.csv; its folder does not exist either (field "file", found "data/summary.csv"). Fix: Check the spelling; paths are read relative to the folder of the claims file (<case>).',
  },
  {
    what: 'a data path that is a folder',
    folder: 'data-path-folder',
    message: 'claims.yaml:6:11: <case>/data is a folder, not a data file (field "file", found "data"). Fix: Point file at the data file inside the folder, e.g. data/summary.csv.',
  },
  {
    what: 'an alias bomb',
    folder: 'claims-alias-bomb',
    message: 'claims.yaml:2:8: aliases (*name) here expand to more than 1000 values, which a claims file never needs. Fix: Write the values out, or use each anchor only a few times.',
  },
  {
    what: 'an oversized claims file',
    folder: 'claims-oversized',
    message:
      'claims.yaml: the claims file is larger than 1 MB, far more than any set of claims needs (found "1083375 bytes"). Fix: Check that this is the claims file and not a data file; data files belong under sources.',
  },
  {
    what: 'an empty claims file',
    folder: 'claims-empty',
    message: 'claims.yaml:1:1: the claims file is empty. Fix: Write at least title, organisation, sources and claims; see the example in the documentation.',
  },
  {
    what: 'a claims file of comments only',
    folder: 'claims-comments-only',
    message: 'claims.yaml:1:1: the claims file is empty. Fix: Write at least title, organisation, sources and claims; see the example in the documentation.',
  },
  {
    what: 'a claims file not in UTF-8',
    folder: 'claims-not-utf8',
    message: 'claims.yaml:1:21: the claims file is not UTF-8 text (it may have been saved in an older encoding such as Windows-1252). Fix: Save it again as UTF-8 in your text editor.',
  },
  {
    what: 'a claim selecting a column the data do not have, placed in the claims file',
    folder: 'claim-unknown-column',
    message: [
      'claims.yaml:14:14: the data of source "results" have no column "Dept" to select on (field "Dept", found "Dept"). Fix: Use one of the columns found: "Department", "Year".',
      'claims.yaml:15:16: the data of source "results" have no column "Dept" to select on (field "Dept", found "Dept"). Fix: Use one of the columns found: "Department", "Year".',
    ].join('\n\n'),
  },
  {
    what: 'an unknown value, with the nearest suggested',
    folder: 'claim-unknown-value',
    message:
      'claims.yaml:14:26: no row of source "results" has this value in column "Department", in claim "hanes-above-lacina" (field "Department", found "Hanse"). Fix: Did you mean "Hanes"? The values of "Department" found are "Hanes", "Łacina", "Brithŵyr".',
  },
  {
    what: 'a relative period on a source without a period column',
    folder: 'claim-relative-period-no-column',
    message:
      'claims.yaml:14:20: "latest" names a period relative to the newest, but source "results" does not say which column holds the period (field "Year", found "latest"). Fix: Add period: followed by the column name (such as Year) to source "results", or write the period itself, e.g. 2026.',
  },
  // ---- data ---------------------------------------------------------------------------------------------------------
  {
    what: 'missing required column',
    folder: 'data-missing-column',
    message:
      'missing-column.csv, row 1: The file has no column with this name in its header row (row 1) (field "respondents", found "Respondents"). Fix: Did you mean "Respondants"? The columns found are "Department", "Respondants", "Agreeing".',
  },
  {
    what: 'empty CSV file (0 bytes)',
    folder: 'data-empty-csv',
    message: 'empty.csv: The file is empty (0 bytes) (found "0 bytes"). Fix: Check that this is the right file, and that it was saved with its data.',
  },
  {
    what: 'header only',
    folder: 'data-header-only',
    message: 'header-only.csv, row 1: The file has a header row but no data rows below it. Fix: Add the data rows, or point the claims file at the file that has them.',
  },
  {
    what: 'percentages written "72%", "72" and "0.72" in one column',
    folder: 'data-percent-mixed',
    message:
      'percent-mixed.csv, row 4: The percent column mixes fractions with percentages: row 4 has "0.72" (a fraction of 1?) but row 2 has "72%" (a percentage) (field "% agree", found "0.72"). Fix: Write every value in the column on one scale: 72% or 72 for seventy-two percent throughout, or 0.72 throughout; a percentage below 1 needs its % sign, e.g. 0.5%.',
  },
  {
    what: 'agreeing greater than respondents',
    folder: 'data-agree-above-respondents',
    message:
      'agree-above.csv, row 3: More people agreed than answered (21 agreeing, 20 respondents) (field "Agreeing", found "21"). Fix: Check the two counts on this row; the agreeing count cannot exceed the number who answered.',
  },
  {
    what: 'negative count',
    folder: 'data-negative-count',
    message: 'negative.csv, row 2: A count is negative (field "Agreeing", found "-3"). Fix: Write the number of people, zero or more.',
  },
  {
    what: 'fractional count',
    folder: 'data-fractional-count',
    message:
      'fractional.csv, row 2: A count is not a whole number (field "Respondents", found "50.5"). Fix: Write the number of people as a whole number; if this is a percentage, name the column with agree_percent instead.',
  },
  {
    what: 'a group row with blank counts',
    folder: 'data-blank-group-row',
    message: 'blank-group.csv, row 3: This row names a group but has no counts (field "Respondents", found ""). Fix: Fill in the counts for this row, or delete the row; if the table ends above it and the rows from here on are notes, set the table\'s last row with "last_row: 2" in the source.',
  },
  {
    what: 'duplicate rows for the same group, both rows named',
    folder: 'data-duplicate-group',
    message:
      'duplicate-group.csv, row 4: This row repeats the group of row 2 (field "Department, Year", found "Department = Hanes, Year = 2026"). Fix: Keep one row per group: remove or merge rows 2 and 4, or add the column that tells them apart.',
  },
  {
    what: 'text in a numeric column, with its row and value',
    folder: 'data-text-in-numeric',
    message:
      'text-numeric.csv, row 3: A value in a numeric column is not a number (field "Staff ratio", found "see note"). Fix: Write a number such as 4.2, or leave the cell blank where there is no value; remove notes, units and markers from the cell.',
  },
  {
    what: 'a quoted value never closed',
    folder: 'data-quote-never-closed',
    message: 'quote-open.csv, row 3: A quoted value is never closed (found "Quoted field unterminated"). Fix: Put a double quote at the end of the quoted value, and write any quote inside it twice ("").',
  },
  {
    what: 'UTF-16 text',
    folder: 'data-utf16',
    message: 'utf16.csv: The file is UTF-16 text (often saved as "Unicode text"), which warrant does not read. Fix: Save it again as CSV UTF-8.',
  },
  {
    what: 'Latin-1 CSV, with the row and the byte',
    folder: 'data-latin1-csv',
    message:
      'latin1.csv, row 3: The file is not UTF-8 text: it was probably saved in another encoding, such as Windows-1252 or Latin-1 (found "byte 0xF4 (\\"ô\\" in Windows-1252)"). Fix: Save the file again as "CSV UTF-8" (in a spreadsheet program, or choose UTF-8 as the encoding in a text editor) and point the claims file at that.',
  },
  {
    what: 'merged header cells',
    folder: 'data-merged-header',
    message:
      'merged-header.xlsx, sheet "Results", row 1: The header row has an empty cell between the columns "Counts" and "Year"; merged header cells read as empty (field "cell C1", found ""). Fix: Unmerge the header cells and give every column its own name in one header row (or name the row that has them with header_row).',
  },
  {
    what: 'a formula with no cached value',
    folder: 'data-formula-no-cached-value',
    message:
      'summary.xlsx, sheet "Results", row 3: A formula cell has no saved result, and warrant does not calculate formulas (field "cell C3", found "a formula with no cached value"). Fix: Open the workbook in a spreadsheet program, let it calculate, and save it; or paste the values in place of the formulas.',
  },
  {
    what: 'data on a hidden sheet not named: the other sheets are named in the fix',
    folder: 'data-hidden-sheet-not-named',
    message:
      'summary.xlsx, sheet "Notes", row 1: The file has no column with this name in its header row (row 1) (field "respondents", found "Respondents"). Fix: Use one of the columns found: "About these results"; warrant read sheet "Notes", the first visible one: if the data are on another sheet ("Results 2026" (hidden)), name it with sheet: in the source.',
  },
  {
    what: 'wrong sheet name',
    folder: 'data-wrong-sheet-name',
    message: 'sheets.xlsx: The workbook has no sheet with this name (field "sheet", found "Results 2025"). Fix: Use one of the sheets in the workbook: "Old" (hidden), "Results 2026", "Notes".',
  },
  {
    what: 'a 0-byte .xlsx',
    folder: 'data-zero-byte-xlsx',
    message: 'zero-byte.xlsx: The file is empty (0 bytes), so it is not an XLSX workbook (found "0 bytes"). Fix: Check that this is the right file, and that it was saved with its data.',
  },
  {
    what: 'a .xlsx that is really CSV',
    folder: 'data-xlsx-really-csv',
    message:
      'xlsx-really-csv.xlsx: The file is not an XLSX workbook: it is plain text (perhaps CSV), though its name ends in .xlsx. Fix: Rename the file to end in .csv (and change the path in the claims file), or save it from a spreadsheet program as .xlsx.',
  },
  {
    what: 'a .csv that is really XLSX',
    folder: 'data-csv-really-xlsx',
    message:
      'csv-really-xlsx.csv: The file is an XLSX workbook (a zip archive), not CSV text, though its name ends in .csv. Fix: Rename the file to end in .xlsx (and change the path in the claims file), or export the sheet as CSV UTF-8.',
  },
  {
    what: 'a PDF renamed .xlsx',
    folder: 'data-pdf-renamed-xlsx',
    message: 'pdf-renamed.xlsx: The file is a PDF document, not an XLSX workbook, whatever its name says. Fix: Get the data as a spreadsheet (.xlsx) or CSV file; a PDF table cannot be read as data.',
  },
  {
    what: 'an old .xls renamed .xlsx',
    folder: 'data-old-xls-renamed',
    message: 'old-format.xlsx: The file is an old-style Excel workbook (.xls), which warrant does not read. Fix: Open it in a spreadsheet program and save it as Excel Workbook (.xlsx) or CSV UTF-8.',
  },
  // ---- command line -------------------------------------------------------------------------------------------------
  {
    what: '--data with an unknown source id',
    folder: 'command-line',
    argv: withBuild('--data', 'nosuch=data.csv'),
    message: 'command line: no source has this id in the claims file (field "--data nosuch", found "nosuch"). Fix: Use one of the source ids: results.',
  },
  {
    what: '--data path missing',
    folder: 'command-line',
    argv: withBuild('--data', 'results=missing.csv'),
    message:
      'missing.csv: the data file given on the command line was not found (looked for at <case>/missing.csv) (field "--data results"). Fix: Check the path; it is read relative to the folder you run warrant in.',
  },
  {
    what: '--data path a folder',
    folder: 'command-line',
    argv: withBuild('--data', 'results=other'),
    message: 'other: the path given on the command line is a folder, not a data file (field "--data results"). Fix: Give the path of the .csv or .xlsx file inside the folder.',
  },
  {
    what: '--data with no =',
    folder: 'command-line',
    argv: withBuild('--data', 'results'),
    message: 'command line: a --data value must be a source id and a path joined by = (field "--data", found "results"). Fix: write it like --data results=data/2026/summary.xlsx.',
  },
  {
    what: '--data naming a file that is neither .csv nor .xlsx',
    folder: 'command-line',
    argv: withBuild('--data', 'results=other/summary.txt'),
    message: 'other/summary.txt: warrant reads .csv and .xlsx data files only (field "--data results", found ".txt"). Fix: Save the data as .xlsx or .csv.',
  },
  {
    what: '--since pointing at nothing',
    folder: 'command-line',
    argv: withBuild('--since', 'old-packs/2026-01-01'),
    message:
      'old-packs/2026-01-01: no pack was found there (a pack folder holds results.json) (field "--since"). Fix: give a pack folder, its results.json, or a history folder with a latest pack.',
  },
  {
    what: '--templates folder missing',
    folder: 'command-line',
    argv: withBuild('--templates', 'my-words'),
    message:
      'my-words: the templates folder was not found (looked for at <case>/my-words) (field "--templates"). Fix: Pass --templates a folder that holds .mustache files named like those in warrant\'s templates/ folder.',
  },
  {
    what: '--templates naming a file',
    folder: 'command-line',
    argv: withBuild('--templates', 'data.csv'),
    message: 'data.csv: this is a file, not a folder of templates (field "--templates"). Fix: Pass --templates the folder that holds the .mustache files.',
  },
  {
    what: '--out naming a file',
    folder: 'command-line',
    argv: ['build', 'claims.yaml', '--out', 'data.csv'],
    message: 'data.csv: this is a file, not a history folder for packs (field "--out"). Fix: Give --out a folder (new or used before for packs of this claims file).',
  },
  {
    what: 'claims file not found',
    folder: 'command-line',
    argv: ['build', 'missing.yaml', '--out', 'out'],
    message: 'missing.yaml: the claims file was not found. Fix: Check the path; it was looked for at <case>/missing.yaml.',
  },
  {
    what: 'claims file a folder',
    folder: 'command-line',
    argv: ['build', 'other', '--out', 'out'],
    message: 'other: this is a folder, not a claims file. Fix: Give the path of the .yaml claims file inside the folder.',
  },
  {
    what: 'an unknown option',
    folder: 'command-line',
    argv: withBuild('--colour'),
    message: 'command line: warrant build has no option with this name (found "--colour"). Fix: Run "warrant build --help" to see the arguments and options.',
  },
  {
    what: 'a misspelt option, with the one meant',
    folder: 'command-line',
    argv: withBuild('--templtes', 'my-words'),
    message: 'command line: warrant build has no option with this name (found "--templtes"). Fix: Did you mean --templates? Run "warrant build --help" to see the arguments and options.',
  },
  {
    what: 'an argument too many (a path with a space, unquoted)',
    folder: 'command-line',
    argv: ['build', 'claims', 'file.yaml', '--out', 'out'],
    message:
      'command line: this argument is more than warrant build takes (found "file.yaml"). Fix: It takes the claims file: warrant build <claims.yaml>; put quotes around a path with spaces in it, and start each option with --.',
  },
  {
    what: 'build without a claims file',
    folder: 'command-line',
    argv: ['build'],
    message: 'command line: warrant build needs the claims file: warrant build <claims.yaml>. Fix: Run "warrant build --help" to see the arguments and options.',
  },
  {
    what: 'a misspelt command, with the one meant',
    folder: 'command-line',
    argv: ['biuld', 'claims.yaml'],
    message: 'command line: warrant has no command with this name (found "biuld"). Fix: Did you mean warrant build? The commands are build, check, seal, init, diff, demo; run "warrant --help" to see what each does.',
  },
  {
    what: 'warrant diff on folders that are not packs',
    folder: 'command-line',
    argv: ['diff', 'not-a-pack', 'other'],
    message: 'not-a-pack: no pack was found there (a pack folder holds results.json). Fix: give two pack folders, e.g. out/claims/2026-03-04-1a2b3c4d5e6f, or their results.json files.',
  },
  {
    what: 'warrant diff with one folder',
    folder: 'command-line',
    argv: ['diff', 'not-a-pack'],
    message:
      'command line: warrant diff needs two pack folders: warrant diff <earlier pack> <later pack>. Fix: Run "warrant diff --help" to see the arguments and options.',
  },
];

/** Doubtful inputs that build: the case, and a check of what the pack's results.json says was read. */
interface Built {
  what: string;
  folder: string;
  argv?: string[];
  check: (results: Results, pdfText: string) => void;
}

interface Results {
  settings: { confidence: number };
  sources: Array<{ id: string; file: string; rows: number; sheet?: string }>;
  claims: Array<{ confidence: number; verdict: string; verdictText: string; interval: { level: number } | null; selections: Array<{ label: string; n: number; agree: number }> }>;
}

const selections = (r: Results): Array<[string, number, number]> => (r.claims[0]?.selections ?? []).map((s) => [s.label, s.n, s.agree]);

const builds: Built[] = [
  {
    what: 'confidence 95 read as 95%',
    folder: 'confidence-95',
    check: (r, text) => {
      expect(r.settings.confidence).toBe(0.95);
      expect(r.claims[0]?.interval?.level).toBe(0.95);
      expect(text).toContain('at the 95% confidence level');
    },
  },
  {
    what: 'confidence "95%" read as 95%',
    folder: 'confidence-95-percent',
    check: (r, text) => {
      expect(r.settings.confidence).toBe(0.95);
      expect(r.claims[0]?.interval?.level).toBe(0.95);
      expect(text).toContain('at the 95% confidence level');
    },
  },
  {
    what: 'semicolon delimiter with decimal commas',
    folder: 'data-semicolon-decimal-comma',
    // Worked by hand from the file: round(72.4% of 50) = round(36.2) = 36; round(64% of 37) = round(23.68) = 24.
    check: (r) => expect(selections(r)).toEqual([
      ['Hanes', 50, 36],
      ['Łacina', 37, 24],
    ]),
  },
  {
    what: 'zero respondents: the group is read with no answers, and withheld as too little data',
    folder: 'data-zero-respondents',
    check: (r, text) => {
      expect(r.sources[0]?.rows).toBe(2);
      expect(r.claims[0]?.verdict).toBe('too-little-data');
      expect(selections(r)).toEqual([]);
      expect(text).toContain('fewer than 10 people answered in Hanes');
    },
  },
  {
    what: 'a byte-order mark before the header',
    folder: 'data-bom',
    check: (r) => expect(selections(r)).toEqual([
      ['Hanes', 50, 30],
      ['Łacina', 20, 5],
    ]),
  },
  {
    what: 'formula cells: their cached results, never evaluated',
    folder: 'data-formula-cached',
    // From make-bad.mjs: Hanes has =25*2 cached as 50 and =B2-20 cached as 30; "Łacina" is a formula's cached text.
    check: (r) => expect(selections(r)).toEqual([
      ['Hanes', 50, 30],
      ['Łacina', 20, 5],
    ]),
  },
  {
    what: 'rich text joined, the hidden first sheet passed over, the first visible of several sheets read',
    folder: 'data-rich-text-sheets',
    // From make-bad.mjs: sheet "Results 2026" holds "Ła" + bold "cina" (20, 5) and Hanes (50, 30): 2 rows, where
    // the hidden sheet "Old" and the sheet "Notes" hold 1 each. (The pack does not name the sheet it read.)
    check: (r) => {
      expect(r.sources[0]?.rows).toBe(2);
      expect(selections(r)).toEqual([
        ['Hanes', 50, 30],
        ['Łacina', 20, 5],
      ]);
    },
  },
  {
    what: 'a hidden sheet chosen by name',
    folder: 'data-hidden-sheet-by-name',
    // Worked by hand: Hanes 50 + 52 answered, 30 + 31 agreed; Łacina 40 + 41 and 20 + 19 (2025 and 2026 pooled).
    check: (r) => {
      expect(selections(r)).toEqual([
        ['Hanes', 102, 61],
        ['Łacina', 81, 39],
      ]);
      expect(r.sources[0]?.rows).toBe(6);
    },
  },
];

// ---- running ---------------------------------------------------------------------------------------------------------

/**
 * Cases also run as a real process (`node bin/warrant.js ...`), to prove the exit code and the streams end to end:
 * one of each sort of input (claims file, data, usage, options, diff) and the builds that read a workbook and a
 * confidence written "95%". Every case runs in-process through main() from src/cli.ts as well, one at a time.
 */
const SPAWNED = new Set([
  'YAML syntax error: a quote never closed',
  'percentages written "72%", "72" and "0.72" in one column',
  'a formula with no cached value',
  'an unknown value, with the nearest suggested',
  'an unknown option',
  '--since pointing at nothing',
  'warrant diff on folders that are not packs',
  'confidence "95%" read as 95%',
  'a hidden sheet chosen by name',
]);

interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
  /** The case's folder, as the command saw it. */
  dir: string;
  /** Its files before and after: relative path -> size and SHA-256 (folders too). */
  before: Map<string, string>;
  after: Map<string, string>;
  /** What was left in the command's TMPDIR. */
  leftInTmp: string[];
}

const work = realpathSync(mkdtempSync(join(tmpdir(), 'warrant-catalogue-')));
const inProcess = new Map<string, Run>();
const spawned = new Map<string, Run>();
const took = { inProcess: 0, spawned: 0, total: 0 };

/** Every file under dir (folders too, so that an empty `out` shows), with its size and SHA-256. */
function snapshot(dir: string): Map<string, string> {
  const out = new Map<string, string>();
  const walk = (d: string): void => {
    for (const name of readdirSync(d).sort()) {
      const p = join(d, name);
      const st = statSync(p);
      if (st.isDirectory()) {
        out.set(`${relative(dir, p)}/`, 'folder');
        walk(p);
      } else out.set(relative(dir, p), `${st.size} ${createHash('sha256').update(readFileSync(p)).digest('hex')}`);
    }
  };
  walk(dir);
  return out;
}

/** A fresh copy of the case's folder and an empty TMPDIR for it. */
function prepare(key: string, folder: string): { dir: string; tmp: string; before: Map<string, string> } {
  const dir = join(work, key, folder);
  const tmp = join(work, key, 'tmp');
  mkdirSync(tmp, { recursive: true });
  cpSync(join(fixtures, folder), dir, { recursive: true });
  return { dir, tmp, before: snapshot(dir) };
}

function spawnCase(key: string, folder: string, argv: string[]): Promise<Run> {
  const { dir, tmp, before } = prepare(`p-${key}`, folder);
  return new Promise((done) => {
    execFile(
      process.execPath,
      [bin, ...argv],
      { cwd: dir, env: { ...process.env, TMPDIR: tmp, TMP: tmp, TEMP: tmp, NO_COLOR: '1' }, encoding: 'utf8', timeout: 60_000 },
      (err, stdout, stderr) => {
        const code = err ? (typeof err.code === 'number' ? err.code : null) : 0;
        done({ code, stdout, stderr, dir, before, after: snapshot(dir), leftInTmp: readdirSync(tmp) });
      },
    );
  });
}

/** main() from src/cli.ts in this process, in the case's folder, with stdout and stderr captured. */
async function mainCase(key: string, folder: string, argv: string[]): Promise<Run> {
  const { dir, tmp, before } = prepare(`m-${key}`, folder);
  const { main } = await import('../../src/cli.js');
  const out: string[] = [];
  const err: string[] = [];
  const saved = { cwd: process.cwd(), tmp: process.env.TMPDIR, stdout: process.stdout.write, stderr: process.stderr.write };
  const capture = (into: string[]) => ((chunk: string | Uint8Array) => (into.push(typeof chunk === 'string' ? chunk : Buffer.from(chunk).toString('utf8')), true)) as typeof process.stdout.write;
  let code: number | null;
  process.chdir(dir);
  process.env.TMPDIR = tmp;
  process.stdout.write = capture(out);
  process.stderr.write = capture(err);
  try {
    code = await main(argv);
  } finally {
    process.stdout.write = saved.stdout;
    process.stderr.write = saved.stderr;
    process.chdir(saved.cwd);
    if (saved.tmp === undefined) delete process.env.TMPDIR;
    else process.env.TMPDIR = saved.tmp;
  }
  return { code, stdout: out.join(''), stderr: err.join(''), dir, before, after: snapshot(dir), leftInTmp: readdirSync(tmp) };
}

/** Run jobs with at most `size` at once. */
async function pool(jobs: Array<() => Promise<void>>, size: number): Promise<void> {
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < jobs.length) await jobs[next++]!();
  };
  await Promise.all(Array.from({ length: Math.min(size, jobs.length) }, worker));
}

/** Compile src/ into dist/ when any source file is newer than its compiled file (the real command runs dist/). */
function ensureBuilt(): void {
  const stale = (dir: string): boolean =>
    readdirSync(dir, { withFileTypes: true }).some((e) => {
      const p = join(dir, e.name);
      if (e.isDirectory()) return stale(p);
      if (!e.name.endsWith('.ts') || e.name.endsWith('.d.ts')) return false;
      const js = join(root, 'dist', relative(join(root, 'src'), p)).replace(/\.ts$/, '.js');
      return !existsSync(js) || statSync(js).mtimeMs < statSync(p).mtimeMs;
    });
  if (!stale(join(root, 'src'))) return;
  try {
    execFileSync(process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', root], { stdio: 'pipe' });
  } catch (e) {
    // tsc still writes dist/ when some file has a type error; the cases say whether the command works.
    if (!existsSync(join(root, 'dist/cli.js'))) throw e;
  }
  // The modules joined as an installed warrant has them (scripts/bundle.mjs), which bin/warrant.js then runs.
  execFileSync(process.execPath, [join(root, 'scripts/bundle.mjs')], { stdio: 'pipe' });
}

const DEBUG_CASE = 'claims-unknown-kind';
const all: Array<{ what: string; folder: string; argv?: string[] }> = [...failures, ...builds];
const keyOf = (i: number): string => `${String(i).padStart(2, '0')}-${all[i]!.folder}`;

beforeAll(async () => {
  const started = performance.now();
  ensureBuilt();
  // Real processes, a few at a time, while the in-process cases run one by one (main() changes the working folder).
  const t0 = performance.now();
  const jobs: Array<() => Promise<void>> = all.flatMap((c, i) => (SPAWNED.has(c.what) ? [async () => void spawned.set(c.what, await spawnCase(keyOf(i), c.folder, c.argv ?? BUILD))] : []));
  jobs.push(async () => void spawned.set('--debug', await spawnCase('debug', DEBUG_CASE, [...BUILD, '--debug'])));
  const processes = pool(jobs, Math.max(2, cpus().length)).then(() => void (took.spawned = (performance.now() - t0) / 1000));
  const t1 = performance.now();
  for (let i = 0; i < all.length; i++) inProcess.set(all[i]!.what, await mainCase(keyOf(i), all[i]!.folder, all[i]!.argv ?? BUILD));
  took.inProcess = (performance.now() - t1) / 1000;
  await processes;
  took.total = (performance.now() - started) / 1000;
}, 180_000);

afterAll(() => {
  rmSync(work, { recursive: true, force: true });
  console.info(
    `Catalogue: ${failures.length} bad inputs and ${builds.length} that build, in ${took.total.toFixed(1)} s ` +
      `(in-process ${took.inProcess.toFixed(1)} s; ${spawned.size} real processes ${took.spawned.toFixed(1)} s, alongside)`,
  );
});

/** The runs of a case: in-process, and as a real process when it is one of those spawned. */
function runsOf(what: string): Array<[string, Run]> {
  const out: Array<[string, Run]> = [['main()', inProcess.get(what)!]];
  const p = spawned.get(what);
  if (p) out.push(['node bin/warrant.js', p]);
  return out;
}

describe('catalogue of bad inputs: exit code 2, exact message, no stack trace, nothing written', () => {
  it('holds at least 40 bad inputs, each named once', () => {
    expect(failures.length).toBeGreaterThanOrEqual(40);
    expect(new Set(all.map((c) => c.what)).size).toBe(all.length);
    expect([...SPAWNED].every((w) => all.some((c) => c.what === w))).toBe(true);
  });

  for (const c of failures) {
    it(`${c.what}${SPAWNED.has(c.what) ? ' (also as a real process)' : ''}`, () => {
      for (const [how, run] of runsOf(c.what)) {
        const expected = c.message.replaceAll('<case>', run.dir);
        expect(run.stderr, how).toBe(`${expected}\n`);
        expect(run.code, how).toBe(2);
        expect(run.stdout, how).toBe('');
        expect(run.stderr, how).not.toMatch(/^\s+at /m);
        expect(run.stderr, how).not.toMatch(/internal error|bug in warrant/);
        expect([...run.after.entries()], how).toEqual([...run.before.entries()]);
        expect(existsSync(join(run.dir, 'out')), how).toBe(false);
        expect(run.leftInTmp, how).toEqual([]);
      }
    });
  }
});

describe('with --debug, the same message and then the stack', () => {
  it(`${DEBUG_CASE} --debug, as a real process`, () => {
    const run = spawned.get('--debug')!;
    const plain = failures.find((c) => c.folder === DEBUG_CASE)!.message;
    expect(run.code).toBe(2);
    expect(run.stderr.startsWith(`${plain}\n`)).toBe(true);
    expect(run.stderr).toMatch(/^InputError: /m);
    expect(run.stderr).toMatch(/^\s+at .*claims\/read\.js/m);
    expect([...run.after.entries()]).toEqual([...run.before.entries()]);
  });
});

describe('doubtful inputs that build: exit code 0 and what the pack says was read', () => {
  for (const c of builds) {
    it(`${c.what}${SPAWNED.has(c.what) ? ' (also as a real process)' : ''}`, () => {
      for (const [how, run] of runsOf(c.what)) {
        expect(run.stderr, how).toBe('');
        expect(run.code, how).toBe(0);
        const packs = readdirSync(join(run.dir, 'out')).filter((n) => n !== 'latest');
        expect(packs, how).toHaveLength(1);
        const pack = join(run.dir, 'out', packs[0]!);
        expect(run.stdout, how).toContain(`Evidence pack written: out/${packs[0]}/pack.pdf`);
        const results = JSON.parse(readFileSync(join(pack, 'results.json'), 'utf8')) as Results;
        // The PDF read back with poppler's pdftotext, independent of the library that wrote it.
        const text = execFileSync('pdftotext', ['-enc', 'UTF-8', join(pack, 'pack.pdf'), '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
        c.check(results, text);
        expect(run.leftInTmp, how).toEqual([]);
      }
    });
  }
});
