/**
 * A PackDiff in words: the pack's "What changed since ..." section, the per-claim notices, and the terminal output
 * of `warrant diff`. Verdict names come from the same templates as the pack.
 */
import * as fmt from '../format/numbers.js';
import type { ChangeSection } from '../render/model.js';
import type { Templates } from '../verdicts/templates.js';
import type { PackDiff } from './diff.js';

function verdictName(t: Templates, verdict: string): string {
  return t.render(`verdict.${verdict}`, {});
}

/** Day of a pack folder name (YYYY-MM-DD-fingerprint) written for people: "4 March 2026". */
export function folderDay(folder: string | undefined): string | undefined {
  const m = folder ? /^(\d{4})-(\d{2})-(\d{2})-/.exec(folder) : null;
  if (!m) return undefined;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
}

function estimateText(name: string, value: number): string {
  return /proportion|rate|difference/i.test(name) ? `${fmt.points(value, { sign: true })} points` : fmt.coefficient(value);
}

function boundText(name: string, value: number): string {
  return /proportion|rate|difference/i.test(name) ? fmt.points(value, { sign: true }) : fmt.coefficient(value);
}

/** The other changes, one sentence each (templates history.*). */
export function changeNotes(d: PackDiff, t: Templates): string[] {
  const notes: string[] = [];
  for (const f of d.data) {
    const view = { id: f.id, file: f.file, fileBefore: f.fileBefore, rowsBefore: fmt.count(f.rowsBefore ?? 0), rowsAfter: fmt.count(f.rowsAfter ?? 0) };
    notes.push(t.render(`history.data-${f.change}`, view));
  }
  if (d.claimsFileChanged && d.edited.length === 0 && d.added.length === 0 && d.removed.length === 0) {
    notes.push(t.render('history.claims-file-edited', {}));
  }
  for (const s of d.settings) notes.push(t.render('history.setting', s));
  for (const id of d.edited) notes.push(t.render('history.claim-edited', { id }));
  for (const id of d.added) notes.push(t.render('history.claim-added', { id }));
  for (const id of d.removed) notes.push(t.render('history.claim-removed', { id }));
  for (const id of d.becameTestable) notes.push(t.render('history.became-testable', { id }));
  for (const id of d.becameUntestable) notes.push(t.render('history.became-untestable', { id }));
  for (const m of d.moved) {
    notes.push(
      t.render('history.moved', {
        id: m.id,
        before: estimateText(m.name, m.before),
        after: estimateText(m.name, m.after),
        lower: boundText(m.name, m.beforeInterval[0]),
        upper: boundText(m.name, m.beforeInterval[1]),
      }),
    );
  }
  return notes;
}

/**
 * What the earlier pack is called in "What changed since ...": its data date when that differs from this pack's
 * (a new release), else the day it was built (a corrected file in the same release).
 */
export function sinceName(d: PackDiff): string {
  if (d.before.date !== d.after.date && d.before.date !== 'undated') return longDate(d.before.date);
  const day = folderDay(d.before.folder);
  return day !== undefined ? `the pack built on ${day}` : longDate(d.before.date);
}

export function longDate(date: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
}

export function changeSection(d: PackDiff, t: Templates): ChangeSection {
  const changed = d.verdicts.length;
  const built = folderDay(d.before.folder);
  return {
    heading: t.render('history.heading', { since: sinceName(d) }),
    intro: t.render('history.intro', {
      ...(built ? { built } : {}),
      date: d.before.date,
      none: changed === 0,
      count: changed,
      one: changed === 1,
      // The caution that other people answered holds only for a verdict that new data changed, not an edited claim's.
      newData: d.verdicts.some((v) => v.reasons.includes('new data')),
    }),
    verdicts: d.verdicts.map((v) => ({ claim: `${v.statement} (${v.id})`, before: verdictName(t, v.before), after: verdictName(t, v.after), why: v.reasons.join(', ') || 'the same inputs' })),
    notes: changeNotes(d, t),
  };
}

/** The sentence placed beside a claim that was edited after an earlier pack showed its results. */
export function editedNotice(builtOn: string, t: Templates): string {
  return t.render('history.notice-edited', { builtOn });
}

/** The sentence placed beside a claim whose verdict changed since the earlier pack. */
export function verdictNotice(d: PackDiff, change: PackDiff['verdicts'][number], t: Templates): string {
  return t.render('history.notice-verdict', { since: sinceName(d), before: verdictName(t, change.before), why: change.reasons.join(', ') });
}

/** `warrant diff` as terminal text. */
export function diffText(d: PackDiff, t: Templates): string {
  const lines: string[] = [];
  const name = (p: PackDiff['before']) => `${p.folder ?? p.fingerprint} (data ${p.date})`;
  lines.push(`Comparing ${name(d.before)}`);
  lines.push(`     with ${name(d.after)}`);
  lines.push('');
  if (d.verdicts.length === 0) lines.push('Verdicts: none changed.');
  else {
    lines.push('Verdicts that changed:');
    for (const v of d.verdicts) lines.push(`  ${v.id}: ${verdictName(t, v.before)} -> ${verdictName(t, v.after)} (${v.reasons.join(', ') || 'the same inputs'})`);
  }
  const notes = changeNotes(d, t);
  if (notes.length > 0) {
    lines.push('');
    lines.push('Other changes:');
    for (const n of notes) lines.push(`  - ${n}`);
  }
  return `${lines.join('\n')}\n`;
}
