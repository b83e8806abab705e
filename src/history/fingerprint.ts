/**
 * Fingerprints: short SHA-256 digests that tell whether two packs were built from the same things.
 * - A claim's fingerprint covers what the claim commits to before results are seen: its words, kind, selections,
 *   direction, sidedness, confidence, thresholds and margin. Where it sits in the file and its display labels do not
 *   count, so moving a claim or renaming a label does not look like a changed claim.
 * - A pack's fingerprint covers the claims file, every data file, the tool version and the options that change
 *   output; it names the pack's folder, so the same inputs always land in the same folder.
 */
import { createHash } from 'node:crypto';
import type { Claim } from '../claims/types.js';

const COSMETIC = new Set(['place', 'naming', 'confidenceWritten', 'focusLabel', 'againstLabel', 'xLabel', 'yLabel', 'selectLabel', 'valueLabel', 'valueWritten']);

/** JSON with object keys sorted, so that key order never changes a digest. */
export function canonicalJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonicalJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, v]) => v !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
  }
  return JSON.stringify(value);
}

export function sha256Hex(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

/** Digest of what a claim commits to (see the file comment). */
export function claimFingerprint(claim: Claim): string {
  // A single column written as a list or as text ("units: Department", "rows: [Campus]") commits to the same thing,
  // and is digested as text, as before units and rows could name several columns.
  const one = (v: unknown): unknown => (Array.isArray(v) && v.length === 1 ? v[0] : v);
  const committed = Object.fromEntries(
    Object.entries(claim)
      .filter(([k]) => !COSMETIC.has(k))
      .map(([k, v]) => (k === 'units' || k === 'rows' || (k === 'columns' && claim.kind === 'crosstab') ? [k, one(v)] : [k, v])),
  );
  return sha256Hex(canonicalJson(committed)).slice(0, 16);
}

/** Digest naming a pack: claims file, data files, tool version and output options. */
export function packFingerprint(parts: { claims: string; data: string[]; version: string; options: Record<string, unknown> }): string {
  return sha256Hex(canonicalJson(parts)).slice(0, 12);
}
