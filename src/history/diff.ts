/**
 * What changed between two packs of the same claims file, computed from their results.json alone: verdicts that
 * changed and why, estimates that moved beyond their earlier intervals, claims added, removed, edited, newly
 * testable or untestable, data files and settings that changed.
 */
import type { ClaimResult, ResultsFile } from '../results/results.js';

export type ChangeReason = 'new data' | 'changed claim' | 'changed threshold' | 'changed method';

export interface VerdictChange {
  id: string;
  statement: string;
  before: string;
  after: string;
  reasons: ChangeReason[];
}

export interface MovedEstimate {
  id: string;
  name: string;
  before: number;
  after: number;
  beforeInterval: [number, number];
}

export interface PackDiff {
  before: { date: string; fingerprint: string; folder?: string };
  after: { date: string; fingerprint: string; folder?: string };
  claimsFileChanged: boolean;
  /** Settings that changed, as "name: before -> after". */
  settings: Array<{ name: string; before: string; after: string }>;
  data: Array<{ id: string; file: string; fileBefore?: string; change: 'changed' | 'added' | 'removed'; rowsBefore?: number; rowsAfter?: number }>;
  added: string[];
  removed: string[];
  edited: string[];
  verdicts: VerdictChange[];
  moved: MovedEstimate[];
  becameTestable: string[];
  becameUntestable: string[];
}

const testable = (c: ClaimResult) => c.verdict !== 'too-little-data';

export function diffPacks(before: ResultsFile, after: ResultsFile, folders: { before?: string; after?: string } = {}): PackDiff {
  const settings: PackDiff['settings'] = [];
  const s0 = before.settings as unknown as Record<string, unknown>;
  const s1 = after.settings as unknown as Record<string, unknown>;
  for (const key of [...new Set([...Object.keys(s0), ...Object.keys(s1)])]) {
    if (JSON.stringify(s0[key]) !== JSON.stringify(s1[key])) settings.push({ name: key, before: String(s0[key] ?? 'not set'), after: String(s1[key] ?? 'not set') });
  }
  const data: PackDiff['data'] = [];
  const src0 = new Map(before.sources.map((s) => [s.id, s]));
  const src1 = new Map(after.sources.map((s) => [s.id, s]));
  for (const [id, s] of src1) {
    const old = src0.get(id);
    if (!old) data.push({ id, file: s.file, change: 'added', rowsAfter: s.rows });
    else if (old.sha256 !== s.sha256) data.push({ id, file: s.file, ...(old.file !== s.file ? { fileBefore: old.file } : {}), change: 'changed', rowsBefore: old.rows, rowsAfter: s.rows });
  }
  for (const [id, s] of src0) if (!src1.has(id)) data.push({ id, file: s.file, change: 'removed', rowsBefore: s.rows });
  const changedSources = new Set(data.map((d) => d.id));

  const c0 = new Map(before.claims.map((c) => [c.id, c]));
  const c1 = new Map(after.claims.map((c) => [c.id, c]));
  const diff: PackDiff = {
    before: { date: before.date, fingerprint: before.fingerprint, ...(folders.before ? { folder: folders.before } : {}) },
    after: { date: after.date, fingerprint: after.fingerprint, ...(folders.after ? { folder: folders.after } : {}) },
    claimsFileChanged: before.claimsFile.sha256 !== after.claimsFile.sha256,
    settings,
    data,
    added: after.claims.filter((c) => !c0.has(c.id)).map((c) => c.id),
    removed: before.claims.filter((c) => !c1.has(c.id)).map((c) => c.id),
    edited: [],
    verdicts: [],
    moved: [],
    becameTestable: [],
    becameUntestable: [],
  };
  for (const now of after.claims) {
    const was = c0.get(now.id);
    if (!was) continue;
    const edited = was.fingerprint !== now.fingerprint;
    if (edited) diff.edited.push(now.id);
    if (was.verdict !== now.verdict) {
      const reasons: ChangeReason[] = [];
      if (changedSources.has(now.source) || was.source !== now.source) reasons.push('new data');
      if (edited) reasons.push('changed claim');
      if (settings.length > 0) reasons.push('changed threshold');
      if (reasons.length === 0 && was.method !== now.method) reasons.push('changed method');
      diff.verdicts.push({ id: now.id, statement: now.statement, before: was.verdict, after: now.verdict, reasons });
    }
    if (!testable(was) && testable(now)) diff.becameTestable.push(now.id);
    if (testable(was) && !testable(now)) diff.becameUntestable.push(now.id);
    if (was.estimate && now.estimate && was.interval && testable(was) && testable(now)) {
      const v = now.estimate.value;
      if (v < was.interval.lower || v > was.interval.upper) {
        diff.moved.push({ id: now.id, name: now.estimate.name, before: was.estimate.value, after: v, beforeInterval: [was.interval.lower, was.interval.upper] });
      }
    }
  }
  return diff;
}

/** True when nothing at all differs. */
export function isEmptyDiff(d: PackDiff): boolean {
  return (
    !d.claimsFileChanged &&
    d.settings.length + d.data.length + d.added.length + d.removed.length + d.edited.length + d.verdicts.length + d.moved.length +
      d.becameTestable.length + d.becameUntestable.length ===
      0
  );
}
