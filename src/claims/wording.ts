/**
 * Do a claim's own words and its fields say the same thing? The words (`claim:`) are what the pack quotes and a
 * committee reads; the fields (`expect`, `value`, `margin`, `last`, `from`, `kind`) are what is tested. When they part
 * (words "below" with `expect: higher`, "the 80% target" with `value: 75%`, "no real difference" tested as a
 * difference), a verdict is printed under words it does not answer.
 *
 * Reading words is never certain ("fewer students disagree" is a higher rate of agreeing), so these are warnings, not
 * errors: `warrant check` lists them, `warrant build` prints them and the claim's page carries a caution. Each rule
 * speaks only when the words are plain: one direction and no negation near it, a number the field does not hold.
 */
import type { Problem } from '../errors.js';
import type { Claim, ClaimsFile } from './types.js';
import { periodsBack } from './amounts.js';
import { orderPeriods, resolvePeriod } from './periods.js';
import { nfc } from '../suggest.js';

/** One disagreement between a claim's words and one of its fields. */
export interface WordsMismatch {
  /** The field the words disagree with, as written in the claims file. */
  field: 'expect' | 'value' | 'margin' | 'last' | 'periods' | 'from' | 'to' | 'kind' | 'where' | 'focus' | 'against' | 'select';
  /** The words of the claim that disagree, as written. */
  words: string;
  /** The field as written. */
  written: string;
  /** For the pack, after "The claim's words": what the words say and what was tested instead. */
  said: string;
  /** For the terminal: the problem and the fix, as sentences without a final full stop. */
  problem: string;
  fix: string;
}

type Direction = 'lower' | 'higher';

/** Words that put a rate or score below (or, in a trend, falling) and above (rising). Lower case; phrases allowed. */
const LOWER = [
  'below', 'lower', 'less', 'fewer', 'fell', 'fallen', 'fall', 'falls', 'falling', 'decline', 'declined', 'declines', 'declining',
  'drop', 'dropped', 'drops', 'dropping', 'worse', 'worsened', 'worsening', 'poorer', 'lags', 'lagged', 'lagging', 'behind', 'short of',
  'smaller', 'decrease', 'decreased', 'decreases', 'decreasing', 'weaker', 'downward', 'slipped', 'shrunk', 'shrank',
];
const HIGHER = [
  'above', 'higher', 'more', 'greater', 'rose', 'risen', 'rise', 'rises', 'rising', 'increase', 'increased', 'increases', 'increasing',
  'better', 'improve', 'improved', 'improves', 'improving', 'exceed', 'exceeds', 'exceeded', 'exceeding', 'ahead', 'at least',
  'stronger', 'upward', 'grew', 'grown', 'climbed', 'outperform', 'outperforms', 'outperformed', 'beats', 'surpasses', 'surpassed',
];
/** Words that turn a direction round or deny it ("not below", "no longer behind", "no more than"). */
const NEGATION = /\b(not|no|never|nor|neither|none|cannot|isn't|aren't|wasn't|weren't|hasn't|haven't|didn't|doesn't|don't|won't)\b|n't\b/;

/** The whole-word pattern of each phrase, made once: a claims file of hundreds of claims reads each claim's words. */
const PHRASE_PATTERNS = new Map<string, RegExp>();

/** Find each phrase of a list in lower-cased words, as whole words; returns the phrases found with their offsets. */
function findPhrases(text: string, phrases: readonly string[]): Array<{ phrase: string; at: number }> {
  const found: Array<{ phrase: string; at: number }> = [];
  for (const p of phrases) {
    // Most phrases are not in a claim's words at all: a plain substring test rules them out before any pattern runs.
    if (!text.includes(p.split(' ')[0]!)) continue;
    let re = PHRASE_PATTERNS.get(p);
    if (re === undefined) {
      re = new RegExp(`(^|[^\\p{L}\\p{N}'’-])(${p.replace(/ /g, '\\s+')})(?=$|[^\\p{L}\\p{N}'’-])`, 'gu');
      PHRASE_PATTERNS.set(p, re);
    }
    re.lastIndex = 0;
    for (let m = re.exec(text); m !== null; m = re.exec(text)) found.push({ phrase: m[2]!, at: m.index + m[1]!.length });
  }
  return found.sort((a, b) => a.at - b.at);
}

/**
 * The direction words of a text, unless it holds a negation anywhere (then it is not plain enough to read: "no longer
 * below", "not more than"). "more and more" and "fewer and fewer" count once.
 */
function directions(text: string): Array<{ dir: Direction; words: string }> | undefined {
  // "more and more", "fewer and fewer": one word.
  const plain = text.replace(/\b([a-z]+) and \1\b/g, '$1');
  const all = [...findPhrases(plain, LOWER).map((f) => ({ ...f, dir: 'lower' as const })), ...findPhrases(plain, HIGHER).map((f) => ({ ...f, dir: 'higher' as const }))].sort(
    (a, b) => a.at - b.at,
  );
  if (NEGATION.test(plain)) return undefined;
  return all.map((f) => ({ dir: f.dir, words: f.phrase }));
}

/** The one direction of a text's words, or undefined when there is none, both, or a negation. */
function oneDirection(text: string): { dir: Direction; words: string } | undefined {
  const found = directions(text);
  if (found === undefined || found.length === 0) return undefined;
  const kinds = new Set(found.map((f) => f.dir));
  if (kinds.size !== 1) return undefined;
  return { dir: found[0]!.dir, words: [...new Set(found.map((f) => f.words))].join('", "') };
}

/** Numbers written with a unit in the text: percents ("80%", "80 per cent") or points ("5 points"). */
function numbersWith(text: string, unit: 'percent' | 'points'): number[] {
  const re = unit === 'percent' ? /(\d+(?:\.\d+)?)\s*(?:%|per\s*cent\b|percent\b)/g : /(\d+(?:\.\d+)?)\s*(?:percentage\s+)?(?:points?|pts?|pp)\b/g;
  const out: number[] = [];
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push(Number(m[1]));
  return out;
}

const COUNT_WORDS: Record<string, number> = { two: 2, three: 3, four: 4, five: 5, six: 6, seven: 7, eight: 8, nine: 9, ten: 10 };

/** "three surveys", "4 rounds", "five years": the counts of periods the text names, with their units. */
function periodCounts(text: string): Array<{ n: number; unit: string; words: string }> {
  const re = /\b(two|three|four|five|six|seven|eight|nine|ten|\d{1,2})\s+(?:consecutive\s+|successive\s+|annual\s+|straight\s+)?(years?|surveys?|rounds?|waves?|releases?|periods?|cycles?)\b/g;
  const out: Array<{ n: number; unit: string; words: string }> = [];
  for (let m = re.exec(text); m !== null; m = re.exec(text)) out.push({ n: COUNT_WORDS[m[1]!] ?? Number(m[1]), unit: m[2]!.replace(/s$/, ''), words: m[0] });
  return out;
}

const pct = (v: number): string => `${Number((v * 100).toPrecision(12))}`;

const SAYS_ALIKE = /\b(no (?:real |meaningful |notable |significant |important )?difference|(?:about|roughly|much) the same|equally|similar(?:ly)?|alike|on a par|in line with|within \d+(?:\.\d+)?\s*(?:percentage\s+)?(?:points?|%))/;

/**
 * Words that make agreeing the unwelcome answer ("fewer students disagree", "less dissatisfied"): a direction in such
 * words is the reverse of the rate's, so the direction rules keep quiet.
 */
const REVERSED = /\b(disagree\w*|dissatisf\w*|unhapp\w*|unsatisf\w*|discontent\w*|complain\w*|dislike\w*|negative\w*)\b/;

/** Text in normal form C with each run of white space as one space, so that a value is found by a substring test. */
const spaced = (s: string): string => nfc(s).replace(/\s+/g, ' ');

const LETTER_OR_DIGIT = /^[\p{L}\p{N}]$/u;

/** The character (whole code point) that ends just before `i`, or '' at the start. */
function charBefore(s: string, i: number): string {
  if (i <= 0) return '';
  const low = s.charCodeAt(i - 1);
  if (low >= 0xdc00 && low <= 0xdfff && i >= 2) {
    const high = s.charCodeAt(i - 2);
    if (high >= 0xd800 && high <= 0xdbff) return s.slice(i - 2, i);
  }
  return s[i - 1]!;
}

/**
 * A value named in words: as a whole word or phrase, in its own case (Law, not "by law"), three characters or more.
 * `text` is the words as `spaced` left them. The column of a claim's source may hold hundreds of values, each tested
 * against every claim's words, so this finds the value as a substring and looks at the characters either side; a
 * pattern made per value (with Unicode letter classes) cost a fraction of a millisecond each to compile.
 */
function namesIn(text: string, value: string): boolean {
  const trimmed = nfc(value.trim());
  if (trimmed.length < 3) return false;
  const v = trimmed.replace(/\s+/g, ' ');
  for (let at = text.indexOf(v); at !== -1; at = text.indexOf(v, at + 1)) {
    const end = at + v.length;
    const after = end < text.length ? String.fromCodePoint(text.codePointAt(end)!) : '';
    if (!LETTER_OR_DIGIT.test(charBefore(text, at)) && !LETTER_OR_DIGIT.test(after)) return true;
  }
  return false;
}

/** A value named in words (see namesIn). */
function names(text: string, value: string): boolean {
  return namesIn(spaced(text), value);
}

/**
 * The claim's words against what its selections pick in the data: words that name a value of a column (a department,
 * an institution, a question code) that no selection of the claim picks, while naming none of the values the
 * selection does pick ("Engineering fell since last year" with where: { Department: Business }). `values` are the
 * distinct values of each column in the claim's source. The period column is left to the period rules.
 */
function wordsAgainstValues(claim: Claim, values: Readonly<Record<string, readonly string[]>>, period: string | undefined): WordsMismatch[] {
  const filters: Array<[string, Record<string, unknown>]> = [['where', claim.where]];
  for (const key of ['focus', 'against', 'select'] as const) {
    const f = (claim as unknown as Record<string, unknown>)[key];
    if (f !== null && typeof f === 'object') filters.push([key, f as Record<string, unknown>]);
  }
  const picked = new Map<string, Set<string>>();
  for (const [, f] of filters) {
    for (const [col, v] of Object.entries(f)) {
      if (v !== null && typeof v === 'object' && !Array.isArray(v)) continue;
      const set = picked.get(col) ?? new Set<string>();
      for (const x of Array.isArray(v) ? v : [v]) set.add(String(x).trim());
      picked.set(col, set);
    }
  }
  const labels = ['focusLabel', 'againstLabel', 'selectLabel'].map((k) => (claim as unknown as Record<string, unknown>)[k]).filter((x): x is string => typeof x === 'string');
  const words = spaced([claim.statement, ...labels].join(' \n '));
  const out: WordsMismatch[] = [];
  for (const [key, f] of filters) {
    for (const [col, v] of Object.entries(f)) {
      if (col === period || (v !== null && typeof v === 'object' && !Array.isArray(v))) continue;
      const known = values[col];
      if (known === undefined) continue;
      const chosen = (Array.isArray(v) ? v : [v]).map((x) => String(x).trim());
      if (chosen.some((c) => namesIn(words, c))) continue;
      const all = picked.get(col) ?? new Set<string>();
      // Another value of the column named, and not a longer value holding a chosen one ("Business and Management").
      const others = known.filter((k) => !all.has(k.trim()) && namesIn(words, k) && !chosen.some((c) => names(k, c)) && !known.some((o) => o !== k && all.has(o.trim()) && names(o, k)));
      if (others.length === 0) continue;
      const said = others.map((o) => `"${o}"`).join(', ');
      const chosenWords = chosen.map((c) => `"${c}"`).join(', ');
      out.push({
        field: key as WordsMismatch['field'],
        words: others.join(', '),
        written: chosen.join(', '),
        said: `name ${said} (${col}), but ${key} picks ${chosenWords}`,
        problem: `the claim's words name ${said}, a value of column "${col}", but ${key} picks ${chosenWords} there, which the words do not name`,
        fix: `Select the ${col} the words name (${key}: { ${col}: ${others[0]} }), or correct the words`,
      });
    }
  }
  return out;
}

/**
 * Every disagreement between a claim's words and its fields (empty when they agree or the words are not plain). With
 * `data` (the distinct values of each column of the claim's source, and its period column), also words that name a
 * value the claim's selections do not pick.
 */
export function wordsAgainstFields(claim: Claim, data?: { values: Readonly<Record<string, readonly string[]>>; period?: string }): WordsMismatch[] {
  const text = claim.statement.toLowerCase().replace(/[‘’]/g, "'");
  const out: WordsMismatch[] = data !== undefined ? wordsAgainstValues(claim, data.values, data.period) : [];

  const directional = claim.kind === 'compare' || claim.kind === 'change' || claim.kind === 'target' || claim.kind === 'means' || claim.kind === 'every';
  const expect = claim.kind === 'compare' || claim.kind === 'change' || claim.kind === 'target' || claim.kind === 'means' || claim.kind === 'every' || claim.kind === 'trend' ? (claim.expect as string) : '';
  // Only the plain directions are read against words; a gap between two groups over periods has words of its own.
  const plainExpect = ['lower', 'higher', 'different', 'rising', 'falling', 'any'].includes(expect) && !(claim.kind === 'change' && (claim as { focus?: unknown }).focus !== undefined);
  if ((directional || claim.kind === 'trend') && plainExpect) {
    const one = REVERSED.test(text) ? undefined : oneDirection(text);
    const up = claim.kind === 'trend' ? 'rising' : 'higher';
    const down = claim.kind === 'trend' ? 'falling' : 'lower';
    const either = claim.kind === 'trend' ? 'any' : 'different';
    if (one !== undefined) {
      const meant = one.dir === 'higher' ? up : down;
      if (expect !== either && expect !== meant) {
        out.push({
          field: 'expect',
          words: one.words,
          written: expect,
          said: `say "${one.words}" (${meant}), but the claim was tested as expecting ${expect}`,
          problem: `the claim's words say "${one.words}" (${meant}), but expect is ${expect}, so the pack tests the opposite of what the words say`,
          fix: `If the words are right, set expect: ${meant}; if the test is right, reword the claim (where agreeing is the unwelcome answer, say it in terms of agreeing)`,
        });
      } else if (expect === either) {
        out.push({
          field: 'expect',
          words: one.words,
          written: expect,
          said: `say "${one.words}" (${meant}), but the claim was tested as expecting any ${claim.kind === 'trend' ? 'trend' : 'difference'}, so a result the other way would also count as support`,
          problem: `the claim's words say "${one.words}" (${meant}), but expect is ${expect}, which counts a ${claim.kind === 'trend' ? 'trend' : 'difference'} either way as support, the opposite of the words included`,
          fix: `Set expect: ${meant} to test what the words say, or reword the claim without a direction`,
        });
      }
    }
  }

  if (claim.kind === 'association' && (claim.expect === 'positive' || claim.expect === 'negative' || claim.expect === 'any')) {
    // "positively", "negatively", "inversely"; else two direction words, one for each measure: alike is positive
    // ("better resources, higher satisfaction"), opposite is negative ("more students per tutor, fewer content").
    const plain = REVERSED.test(text) || NEGATION.test(text) ? undefined : text;
    let meant: 'positive' | 'negative' | undefined;
    let words = '';
    if (plain !== undefined) {
      const pos = /\bpositive(ly)?\b/.exec(plain);
      const neg = /\b(negative(ly)?|inverse(ly)?)\b/.exec(plain);
      if (pos !== null && neg === null) [meant, words] = ['positive', pos[0]];
      else if (neg !== null && pos === null) [meant, words] = ['negative', neg[0]];
      else if (pos === null && neg === null) {
        const found = directions(plain);
        if (found !== undefined && found.length === 2) {
          meant = found[0]!.dir === found[1]!.dir ? 'positive' : 'negative';
          words = `${found[0]!.words} ... ${found[1]!.words}`;
        }
      }
    }
    if (meant !== undefined && meant !== claim.expect) {
      const any = claim.expect === 'any';
      out.push({
        field: 'expect',
        words,
        written: claim.expect,
        said: any
          ? `say "${words}" (a ${meant} association), but the claim was tested as expecting an association either way, so one the other way would also count as support`
          : `say "${words}" (a ${meant} association), but the claim was tested as expecting a ${claim.expect} one`,
        problem: any
          ? `the claim's words say "${words}" (a ${meant} association), but expect is any, which counts an association either way as support, the opposite of the words included`
          : `the claim's words say "${words}" (a ${meant} association), but expect is ${claim.expect}, so the pack tests the opposite of what the words say`,
        fix: `If the words are right, set expect: ${meant}; if the test is right, reword the claim`,
      });
    }
  }

  if ((claim.kind === 'compare' || claim.kind === 'means') && claim.expect === 'different') {
    const m = SAYS_ALIKE.exec(text);
    if (m !== null) {
      out.push({
        field: 'kind',
        words: m[0],
        written: claim.kind,
        said: `say "${m[0]}", but the claim was tested for a difference; a result that is not supported would not show that the two are alike`,
        problem: `the claim's words say "${m[0]}", but kind ${claim.kind} tests for a difference, and finding none does not show that the two are alike`,
        fix: 'Write it as kind: equivalence with the margin within which the two count as alike (e.g. margin: 5 points)',
      });
    }
  }

  if (claim.kind === 'target' || claim.kind === 'every') {
    const written = numbersWith(text, 'percent');
    if (written.length > 0 && !written.some((n) => Math.abs(n / 100 - claim.value) < 1e-9)) {
      const words = `${written.join('%, ')}%`;
      out.push({
        field: 'value',
        words,
        written: claim.valueWritten,
        said: `name ${words}, but the claim was tested against ${pct(claim.value)}%`,
        problem: `the claim's words name ${words}, but value is ${claim.valueWritten}${/%$/.test(claim.valueWritten) ? '' : ` (${pct(claim.value)}%)`}`,
        fix: `Make value the figure the words name (value: ${written[0]}%), or correct the words`,
      });
    }
  }

  if (claim.kind === 'rank') {
    // "the highest", "the best", "tops"... against expect: lowest, and the reverse; words naming both say nothing.
    const high = /\b(highest|best|top|tops|most|greatest|leads?|leading)\b/.exec(text);
    const low = /\b(lowest|worst|bottom|least|trails?)\b/.exec(text);
    const said = high !== null && low === null ? { dir: 'highest' as const, words: high[0] } : low !== null && high === null ? { dir: 'lowest' as const, words: low[0] } : undefined;
    if (said !== undefined && said.dir !== claim.expect) {
      out.push({
        field: 'expect',
        words: said.words,
        written: claim.expect,
        said: `say "${said.words}" (${said.dir}), but the claim was tested as expecting ${claim.expect}`,
        problem: `the claim's words say "${said.words}" (${said.dir}), but expect is ${claim.expect}, so the pack tests the opposite of what the words say`,
        fix: `If the words are right, set expect: ${said.dir}; if the test is right, reword the claim`,
      });
    }
  }

  if (claim.kind === 'equivalence') {
    const written = [...numbersWith(text, 'points'), ...numbersWith(text, 'percent')];
    if (written.length > 0 && !written.some((n) => Math.abs(n / 100 - claim.margin) < 1e-9)) {
      const words = written.map((n) => `${n} points`).join(', ');
      out.push({
        field: 'margin',
        words,
        written: `${pct(claim.margin)} points`,
        said: `name ${words}, but the claim was tested with a margin of ${pct(claim.margin)} points`,
        problem: `the claim's words name ${words}, but margin is ${pct(claim.margin)} points`,
        fix: `Make margin the figure the words name (margin: ${written[0]} points), or correct the words`,
      });
    }
  }

  if (claim.kind === 'trend') {
    const count = Array.isArray(claim.periods) ? claim.periods.length : claim.periods.last;
    const field = Array.isArray(claim.periods) ? 'periods' : 'last';
    for (const c of periodCounts(text)) {
      // "over three years" may mean three surveys or the three years between four: both are read as agreeing.
      const fits = c.unit === 'year' ? c.n === count || c.n === count - 1 : c.n === count;
      if (fits) continue;
      out.push({
        field,
        words: c.words,
        written: Array.isArray(claim.periods) ? `[${claim.periods.join(', ')}]` : String(count),
        said: `say "${c.words}", but the claim was tested over ${count} periods`,
        problem: `the claim's words say "${c.words}", but ${field} gives ${count} periods`,
        fix: field === 'last' ? `Set last: ${c.unit === 'year' ? `${c.n} (or ${c.n + 1} to span ${c.n} years)` : c.n}, or correct the words` : 'List the periods the words name, or correct the words',
      });
      break;
    }
  }

  if (claim.kind === 'change' || claim.kind === 'gap-change') {
    const lastYear = /\b(last|previous|a) (year|survey|round|wave|release)('s)?\b|\b(a year ago|year on year)\b/.exec(text);
    const back = periodsBack(claim.from);
    const toBack = periodsBack(claim.to);
    // from after to is refused against the data (src/analyse/change.ts), with its own message.
    if (lastYear !== null && back !== undefined && toBack !== undefined && back - toBack > 1) {
      out.push({
        field: 'from',
        words: lastYear[0],
        written: String(claim.from),
        said: `say "${lastYear[0]}", but the claim compared periods ${back - toBack} apart (from ${String(claim.from)} to ${String(claim.to)})`,
        problem: `the claim's words say "${lastYear[0]}", but from ${String(claim.from)} and to ${String(claim.to)} are ${back - toBack} periods apart`,
        fix: toBack === 0 ? 'Set from: previous, or correct the words' : 'Set from one period before to, or correct the words',
      });
    }
    const years = [...text.matchAll(/\b(19|20)\d\d\b/g)].map((m) => m[0]);
    // latest, previous, latest-N: the period they name in the data, when the data are at hand (as in the pack, where
    // the claim arrives with its periods already resolved), so that `warrant check` says what the pack will say.
    const ordered = data?.period !== undefined && data.values[data.period] !== undefined ? orderPeriods(data.values[data.period]!) : undefined;
    const sides = (['from', 'to'] as const).map((key) => {
      const v = claim[key];
      const relative = periodsBack(v) !== undefined;
      const resolved = relative && ordered !== undefined ? resolvePeriod(v, ordered) : undefined;
      return { key, v, relative, period: resolved?.ok === true ? resolved.period : String(v).trim() };
    });
    // One year in the words ("since 2024", "in 2026") names one end: it must be one of the two, and when it is neither,
    // the end it is nearer in time is the one to set. Two or more name both ends.
    const oneYear = years.length === 1 ? Number(years[0]) : undefined;
    const mismatched = years.length === 0 ? [] : sides.filter((side) => /^(19|20)\d\d$/.test(side.period) && !years.includes(side.period));
    const flagged =
      oneYear === undefined || mismatched.length < 2
        ? oneYear !== undefined && sides.some((side) => side.period === years[0]) ? [] : mismatched
        : [oneYear > Number(sides[1]!.period) ? sides[1]! : sides[0]!];
    for (const { key, v, relative, period } of flagged) {
      const shown = relative ? `${String(v)} (${period})` : period;
      out.push({
        field: key,
        words: years.join(', '),
        written: String(v),
        said: `name ${years.join(' and ')}, but the claim compared ${key === 'from' ? 'from' : 'to'} ${shown}`,
        problem: `the claim's words name ${years.join(' and ')}, but ${key} is ${shown}`,
        fix:
          ordered !== undefined && !years.some((y) => ordered.includes(y))
            ? `The data hold ${ordered.join(', ')}, not ${years.join(' or ')}: correct the words`
            : relative
              ? `Set ${key} to the year the words name (${key}: ${years.find((y) => ordered?.includes(y) ?? true)}), or correct the words`
              : `Set ${key} to the year the words name, or correct the words`,
      });
    }
  }
  return out;
}

/**
 * The disagreements of every claim of a file as problems for the terminal (`warrant check`, `warrant build`), placed
 * at the claim; they are warnings, never a reason to stop.
 */
export function wordsProblems(claims: ClaimsFile, file: string, dataOf?: (claim: Claim) => { values: Readonly<Record<string, readonly string[]>>; period?: string } | undefined): Problem[] {
  return claims.claims.flatMap((c) =>
    wordsAgainstFields(c, dataOf?.(c)).map((m) => ({
      file,
      line: c.place.line,
      column: c.place.column,
      field: m.field,
      found: m.words,
      problem: `${m.problem}, in claim "${c.id}"`,
      fix: m.fix,
    })),
  );
}
