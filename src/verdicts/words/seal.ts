/**
 * What a pack can prove about when its claims were written (src/commands/seal.ts): one sentence for the summary,
 * a notice for each claim added or edited after sealing, and the facts for results.json.
 */
import type { Claim, ClaimsFile } from '../../claims/types.js';
import type { SealFile } from '../../commands/seal.js';
import { claimFingerprint } from '../../history/fingerprint.js';
import { longDate } from '../../history/words.js';
import type { Templates } from '../templates.js';

export interface SealStatus {
  /** The summary's sentence: what the seal proves, or that there is none. */
  text: string;
  /** Claims added or edited after sealing, id -> notice for the claim's page. */
  notices: Map<string, string>;
  /** For results.json. */
  facts: {
    file: string;
    /** Earliest and latest day a claim still as sealed was sealed (YYYY-MM-DD). */
    firstSealed: string | null;
    lastSealed: string | null;
    /** True when the latest such day is before the claims file's data_date. */
    beforeData: boolean | null;
    sealed: string[];
    addedOrEdited: string[];
  } | null;
}

function isDay(s: string | undefined): s is string {
  return s !== undefined && /^\d{4}-\d{2}-\d{2}$/.test(s);
}

export function sealStatus(claims: ClaimsFile, written: readonly Claim[], seal: SealFile | undefined, sealFileName: string, t: Templates): SealStatus {
  if (!seal) return { text: t.render('seal.none', {}), notices: new Map(), facts: null };
  const entries = new Map(seal.claims.map((c) => [c.id, c]));
  const sealed: Array<{ id: string; day: string }> = [];
  const after: string[] = [];
  for (const c of written) {
    const e = entries.get(c.id);
    if (e && e.fingerprint === claimFingerprint(c)) sealed.push({ id: c.id, day: e.sealed });
    else after.push(c.id);
  }
  const days = sealed.map((s) => s.day).sort();
  const first = days[0];
  const last = days[days.length - 1];
  const dataDate = isDay(claims.dataDate) ? claims.dataDate : undefined;
  const beforeData = last !== undefined && dataDate !== undefined ? last < dataDate : null;
  const total = written.length;
  const count = sealed.length;
  const view = {
    subject:
      count === total ? (total === 1 ? 'This claim was' : `These ${total} claims were`) : `${count} of these ${total} claims ${count === 1 ? 'was' : 'were'}`,
    when: first === last ? `on ${longDate(first ?? '')}` : `between ${longDate(first ?? '')} and ${longDate(last ?? '')}`,
    dataDate: dataDate ? longDate(dataDate) : '',
    before: beforeData === true,
    notBefore: beforeData === false,
    after: after.length > 0,
    afterCount: after.length,
    afterClaims: after.length === 1 ? 'claim was' : 'claims were',
    total,
    file: sealFileName,
  };
  const text = t.render(count === 0 ? 'seal.none-match' : 'seal.sealed', view);
  const notice = t.render('seal.notice-after', { when: last ? longDate(last) : '' , sealedAny: last !== undefined });
  return {
    text,
    notices: new Map(after.map((id) => [id, notice])),
    facts: { file: sealFileName, firstSealed: first ?? null, lastSealed: last ?? null, beforeData, sealed: sealed.map((s) => s.id), addedOrEdited: after },
  };
}
