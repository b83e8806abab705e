/**
 * What a reader of the pack (and of `warrant check`) should know about how a source's table was read: where it ended
 * and what was taken as notes, rows withheld in the release, footnote markers read off numbers, a header of two rows,
 * and the cube's own notes (percentages read as fractions, counts rebuilt from percentages). One sentence each, from
 * templates/data.*.mustache.
 */
import type { Templates } from '../verdicts/templates.js';
import type { Cube } from './types.js';
import { grouped } from '../format/numbers.js';

const count = grouped;
const quoteList = (xs: string[]): string => xs.map((x) => `"${x}"`).join(', ');

export function readingNotes(cube: Cube, t: Templates): string[] {
  const out: string[] = [];
  if (cube.headerRows === 2) {
    const labelled = Object.keys(cube.labels ?? {}).length;
    out.push(t.render('data.two-header-rows', { labelled: labelled > 0 ? count(labelled) : undefined }));
  }
  const end = cube.tableEnd;
  if (end !== undefined) {
    out.push(
      t.render('data.notes-under-table', {
        rows: count(cube.rows),
        lastRow: String(end.lastRow),
        noteRows: count(end.noteRows),
        one: end.noteRows === 1,
        firstNoteRow: String(end.firstNoteRow),
        firstNote: end.firstNote,
        bySource: end.by === 'source',
      }),
    );
  }
  if (cube.suppressedRows !== undefined && cube.suppressedRows > 0) {
    const markers = Object.keys(cube.suppressedMarkers ?? {});
    out.push(t.render('data.suppressed-rows', { rows: count(cube.suppressedRows), one: cube.suppressedRows === 1, of: count(cube.rows), markers: quoteList(markers) }));
  }
  for (const f of cube.footnotes ?? []) {
    // Where the table has notes under it, the marker's meaning is most likely there.
    const notesRow = end !== undefined && end.noteRows > 0 ? String(end.firstNoteRow) : '';
    out.push(t.render('data.footnote-marker', { marker: f.marker, cells: count(f.cells), one: f.cells === 1, example: f.example, row: String(f.row), notesRow }));
  }
  out.push(...(cube.notes ?? []));
  return out;
}
