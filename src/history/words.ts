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

/** The other changes, one sentence each. */
export function changeNotes(d: PackDiff): string[] {
  const notes: string[] = [];
  for (const f of d.data) {
    if (f.change === 'changed') notes.push(`Data file ${f.file} (${f.id}) is not the same file as before: ${fmt.count(f.rowsBefore ?? 0)} rows then, ${fmt.count(f.rowsAfter ?? 0)} now.`);
    else if (f.change === 'added') notes.push(`Data source ${f.id} (${f.file}) is new.`);
    else notes.push(`Data source ${f.id} (${f.file}) is no longer used.`);
  }
  if (d.claimsFileChanged && d.edited.length === 0 && d.added.length === 0 && d.removed.length === 0) {
    notes.push('The claims file was edited, but no claim changed what it commits to (only wording outside the claims, labels or layout).');
  }
  for (const s of d.settings) notes.push(`Setting ${s.name} changed from ${s.before} to ${s.after}.`);
  for (const id of d.edited) notes.push(`Claim ${id} was edited: its words, selections, direction, confidence or thresholds differ from before.`);
  for (const id of d.added) notes.push(`Claim ${id} is new.`);
  for (const id of d.removed) notes.push(`Claim ${id} was removed from the claims file.`);
  for (const id of d.becameTestable) notes.push(`Claim ${id} now has enough respondents to be tested.`);
  for (const id of d.becameUntestable) notes.push(`Claim ${id} no longer has enough respondents to be tested.`);
  for (const m of d.moved) {
    notes.push(
      `The estimate for ${m.id} moved from ${estimateText(m.name, m.before)} to ${estimateText(m.name, m.after)}, outside the earlier interval (${boundText(m.name, m.beforeInterval[0])} to ${boundText(m.name, m.beforeInterval[1])}).`,
    );
  }
  return notes;
}

/** The pack's change section. */
/**
 * What the earlier pack is called in "What changed since ...": its data date when that differs from this pack's
 * (a new release), else the day it was built (a corrected file in the same release).
 */
export function sinceName(d: PackDiff): string {
  if (d.before.date !== d.after.date && d.before.date !== 'undated') return longDate(d.before.date);
  const day = folderDay(d.before.folder);
  return day !== undefined ? `the pack built on ${day}` : longDate(d.before.date);
}

function longDate(date: string): string {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(date);
  if (!m) return date;
  return new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]))).toLocaleDateString('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' });
}

export function changeSection(d: PackDiff, t: Templates): ChangeSection {
  const since = sinceName(d);
  const built = folderDay(d.before.folder);
  const changed = d.verdicts.length;
  const intro =
    `This pack is compared with the earlier pack of the same claims file${built ? ` built on ${built}` : ''} (data dated ${d.before.date}). ` +
    (changed === 0 ? 'No verdict changed.' : `${changed} ${changed === 1 ? 'verdict' : 'verdicts'} changed.`) +
    ' Different people answer each survey, so a changed verdict may reflect a different group of respondents as much as a real change.';
  return {
    heading: `What changed since ${since}`,
    intro,
    verdicts: d.verdicts.map((v) => ({ claim: `${v.statement} (${v.id})`, before: verdictName(t, v.before), after: verdictName(t, v.after), why: v.reasons.join(', ') || 'the same inputs' })),
    notes: changeNotes(d),
  };
}

/** The sentence placed beside a claim that was edited after an earlier pack showed its results. */
export function editedNotice(builtOn: string): string {
  return `This claim was changed after an earlier pack (built ${builtOn}) showed its results. A claim edited after its results were seen is weaker evidence than one fixed in advance.`;
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
  const notes = changeNotes(d);
  if (notes.length > 0) {
    lines.push('');
    lines.push('Other changes:');
    for (const n of notes) lines.push(`  - ${n}`);
  }
  return `${lines.join('\n')}\n`;
}
