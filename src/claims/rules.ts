/**
 * Rules that involve more than one field or the file system: confidence levels, unique claim ids, sources that
 * exist, one-sided tests with a direction, data files that exist and can be read. They run on the raw data even when
 * the schema found problems, checking only what is well-formed, so that every problem is reported in one pass.
 */
import { readdirSync, statSync } from 'node:fs';
import { basename, dirname, extname, resolve } from 'node:path';
import type { Problem } from '../errors.js';
import { CONFIDENCE_FORMS, readConfidence } from './confidence.js';
import { closest } from '../suggest.js';
import { describeOwner } from './validate.js';
import { locate, type ParsedYaml } from './yaml.js';

/** Codes counted as agreeing when agree_codes is not written (the top two points of a five-point scale). */
export const DEFAULT_AGREE_CODES = [4, 5] as const;

export const DATA_EXTENSIONS: Record<string, 'csv' | 'xlsx'> = { '.csv': 'csv', '.xlsx': 'xlsx' };

type Rec = Record<string, unknown>;
const isRec = (v: unknown): v is Rec => v !== null && typeof v === 'object' && !Array.isArray(v);

export function crossFieldProblems(parsed: ParsedYaml, file: string, claimsDir: string): Problem[] {
  const data = parsed.data;
  if (!isRec(data)) return [];
  const problems: Problem[] = [];
  const at = (path: Array<string | number>, prefer: 'key' | 'value' = 'value'): { line: number; column: number } => {
    const l = locate(parsed, path);
    const place = prefer === 'key' ? (l.key ?? l.value ?? l.nearest) : (l.value ?? l.key ?? l.nearest);
    return { line: place.line, column: place.column };
  };

  const checkConfidence = (path: Array<string | number>): void => {
    const raw = (path.length === 1 ? data : (data.claims as unknown[])[path[1] as number]) as Rec;
    if (!isRec(raw) || !('confidence' in raw)) return;
    const r = readConfidence(raw.confidence);
    if (r.ok) return;
    problems.push({
      file,
      ...at(path),
      field: 'confidence',
      found: r.written,
      problem: `the confidence level ${r.written} ${r.reason}`,
      fix: `Write it as ${CONFIDENCE_FORMS}; any level above 50% and up to 99.9% is accepted`,
    });
  };
  checkConfidence(['confidence']);

  // Sources: file extension, existence, sheet only for workbooks, codes not both agreeing and not applicable.
  const sources = isRec(data.sources) ? data.sources : {};
  const sourceIds = Object.keys(sources);
  for (const id of sourceIds) {
    const src = sources[id];
    if (!isRec(src)) continue;
    if (typeof src.file === 'string' && src.file !== '') {
      const ext = extname(src.file).toLowerCase();
      const fileAt = at(['sources', id, 'file']);
      if (DATA_EXTENSIONS[ext] === undefined) {
        problems.push({
          file,
          ...fileAt,
          field: 'file',
          found: src.file,
          problem: `warrant reads .csv and .xlsx files, and ${ext === '' ? 'this file name has no extension' : `"${ext}" is neither`}`,
          fix:
            ext === '.xls' || ext === '.ods' || ext === '.numbers'
              ? 'Save the spreadsheet as .xlsx (Excel workbook) and point file at the saved copy'
              : 'Save the data as .csv or .xlsx and point file at that copy',
        });
      } else {
        problems.push(...fileProblems(src.file, claimsDir, file, fileAt));
        if (DATA_EXTENSIONS[ext] === 'csv' && 'sheet' in src) {
          problems.push({
            file,
            ...at(['sources', id, 'sheet'], 'key'),
            field: 'sheet',
            problem: `source "${id}" names a sheet, but a .csv file has no sheets`,
            fix: 'Delete the sheet line, or point file at the .xlsx workbook',
          });
        }
      }
    }
    const agreeCodes: unknown[] = Array.isArray(src.agree_codes) ? src.agree_codes : [...DEFAULT_AGREE_CODES];
    if (Array.isArray(src.not_applicable)) {
      const both = agreeCodes.filter((c) => (src.not_applicable as unknown[]).includes(c));
      if (both.length > 0) {
        problems.push({
          file,
          ...at(['sources', id, 'not_applicable']),
          field: 'not_applicable',
          found: both.join(', '),
          problem: `code ${both.join(', ')} is listed both as agreeing and as not applicable in source "${id}"${Array.isArray(src.agree_codes) ? '' : ' (agree_codes is not written, so the default [4, 5] applies)'}`,
          fix: Array.isArray(src.agree_codes) ? 'Keep each code in one list only' : 'Remove it from not_applicable, or write agree_codes without it',
        });
      }
    }
  }

  // Claims: confidence, unique ids, named source, one-sided needs a direction.
  const claims = Array.isArray(data.claims) ? data.claims : [];
  const firstById = new Map<string, { line: number; column: number }>();
  claims.forEach((c, i) => {
    if (!isRec(c)) return;
    checkConfidence(['claims', i, 'confidence']);
    if (typeof c.id === 'string' && c.id !== '') {
      const here = at(['claims', i, 'id']);
      const first = firstById.get(c.id);
      if (first) {
        problems.push({
          file,
          ...here,
          field: 'id',
          found: c.id,
          problem: `the claim id "${c.id}" is used twice: here (line ${here.line}) and at line ${first.line}, column ${first.column}`,
          fix: 'Give each claim its own id, e.g. by adding a year or a place to one of them',
        });
      } else {
        firstById.set(c.id, here);
      }
    }
    if (typeof c.source === 'string' && c.source !== '') {
      if (sourceIds.length > 0 && !sourceIds.includes(c.source)) {
        const guess = closest(c.source, sourceIds);
        problems.push({
          file,
          ...at(['claims', i, 'source']),
          field: 'source',
          found: c.source,
          problem: `${describeOwner(data, ['claims', i])} names a source that is not defined under sources`,
          fix: guess !== undefined ? `Did you mean "${guess}"? Use one of: ${sourceIds.join(', ')}` : `Use one of: ${sourceIds.join(', ')}, or add "${c.source}" under sources`,
        });
      }
    } else if (!('source' in c) && sourceIds.length > 1) {
      problems.push({
        file,
        ...at(['claims', i]),
        field: 'source',
        problem: `${describeOwner(data, ['claims', i])} does not say which source it uses, and there are ${sourceIds.length}`,
        fix: `Add source: followed by one of ${sourceIds.join(', ')}`,
      });
    }
    if (c.test === 'one-sided' && (c.expect === 'different' || c.expect === 'any')) {
      problems.push({
        file,
        ...at(['claims', i, 'test']),
        field: 'test',
        found: 'one-sided',
        problem: `${describeOwner(data, ['claims', i])} asks for a one-sided test but expects "${c.expect}", which has no direction`,
        fix:
          c.kind === 'association'
            ? 'Set expect to positive or negative, or use test: two-sided'
            : 'Set expect to lower or higher, or use test: two-sided',
      });
    }
  });
  return problems;
}

/** The data file must exist and be a file; suggest a near-miss name in the same folder. */
function fileProblems(written: string, claimsDir: string, file: string, place: { line: number; column: number }): Problem[] {
  const abs = resolve(claimsDir, written);
  let stat;
  try {
    stat = statSync(abs);
  } catch {
    let hint = '';
    try {
      const siblings = readdirSync(dirname(abs));
      const guess = closest(basename(abs), siblings);
      if (guess !== undefined) hint = `; there is a "${guess}" in that folder`;
    } catch {
      hint = '; its folder does not exist either';
    }
    return [
      {
        file,
        ...place,
        field: 'file',
        found: written,
        problem: `the data file was not found at ${abs}${hint}`,
        fix: `Check the spelling; paths are read relative to the folder of the claims file (${claimsDir})`,
      },
    ];
  }
  if (stat.isDirectory()) {
    let inside: string | undefined;
    try {
      inside = readdirSync(abs).find((n) => DATA_EXTENSIONS[extname(n).toLowerCase()] !== undefined);
    } catch {
      inside = undefined;
    }
    const folder = written.replace(/[\\/]+$/, '');
    return [
      {
        file,
        ...place,
        field: 'file',
        found: written,
        problem: `${abs} is a folder, not a data file`,
        fix:
          inside !== undefined
            ? `Point file at the data file inside the folder, e.g. ${folder}/${inside}`
            : 'Point file at a .csv or .xlsx file; this folder holds none',
      },
    ];
  }
  return [];
}
