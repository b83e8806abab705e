/**
 * The hot path of the XLSX reader: a hand-written scanner for a worksheet part's XML (ECMA-376 Part 1, §18.3.1
 * `sheetData`, `row`, `c`, `v`, `f`, `is`), fed decoded text piece by piece. A general SAX parser builds an attribute
 * object and fires events for every tag and text run; at a million rows of a dozen cells that is most of the reading
 * time, so the sheet itself is scanned here with indexOf and only what a cell needs is taken (its reference, type
 * and style, and the text of `v` or of the `t` runs of an inline string). The small parts of the workbook (workbook,
 * relationships, styles, shared strings) are still read with saxes.
 *
 * XML handled (W3C XML 1.0 §2.4 character data, §2.5 comments, §2.6 processing instructions, §2.7 CDATA sections,
 * §3.1 tags and attributes, §4.1 character and predefined entity references): comments, processing instructions and
 * CDATA sections are recognised anywhere; a document type declaration or an entity other than the five predefined
 * ones and numeric references is damage. Anything the scanner cannot make sense of (a tag never closed, an element
 * left open at the end, a bad reference) raises `damaged`, never a wrong value.
 *
 * Two quicker paths read the commonest forms and leave everything else to the general one: `feedBytes` reads whole
 * rows of plain cells (shared strings and whole numbers) straight from the inflated bytes, and `plainCell` reads a
 * plain cell from the text in one step. Tests check both against the general path on random sheets.
 */
import { InputError } from '../errors.js';
import type { SheetRow } from './rows.js';
import { columnLetters, formatNumber } from './xlsx.js';

export interface ScanContext {
  file: string;
  sheet: string;
  shared: string[];
  /** For each cell style index (the `s` attribute), true when its number format shows a date or time. */
  dateStyles: boolean[];
  /** True for the 1904 date system (workbookPr date1904). */
  date1904: boolean;
  damaged: (message: string) => InputError;
}

const LT = 60; // <
const GT = 62; // >
const SLASH = 47; // /
const BANG = 33; // !
const QUESTION = 63; // ?
const DQUOTE = 34;
const SQUOTE = 39;

/** Whole numbers below this are written from a table of their texts, not made anew for each cell. */
const SMALL_NUMBERS = 10_000;
let smallTexts: string[] | undefined;
function smallNumber(x: number): string {
  smallTexts ??= Array.from({ length: SMALL_NUMBERS }, (_, i) => String(i));
  return smallTexts[x]!;
}

const ENTITIES: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };

/** Replace the predefined entities and character references in text; anything else is damage. */
export function decodeEntities(text: string, damaged: (message: string) => InputError): string {
  if (text.indexOf('&') < 0) return text;
  return text.replace(/&([^;&\s]{0,12});?/g, (whole, name: string) => {
    if (!whole.endsWith(';')) throw damaged(`an "&" that does not start a reference: ${JSON.stringify(whole)}`);
    const named = ENTITIES[name];
    if (named !== undefined) return named;
    const m = /^#(?:x([0-9a-fA-F]{1,6})|([0-9]{1,7}))$/.exec(name);
    const code = m === null ? NaN : m[1] !== undefined ? parseInt(m[1], 16) : Number(m[2]);
    if (!(code >= 1 && code <= 0x10ffff) || (code >= 0xd800 && code <= 0xdfff)) throw damaged(`an unknown or bad reference "&${name};"`);
    return String.fromCodePoint(code);
  });
}

/** Local name of a tag (prefix dropped), from the text between '<' (or '</') and the end of the name. */
function tagName(s: string, from: number, end: number): string {
  let j = from;
  while (j < end) {
    const ch = s.charCodeAt(j);
    if (ch === 32 || ch === 9 || ch === 10 || ch === 13 || ch === SLASH) break;
    j++;
  }
  // The sheet's own unprefixed names without a new string: c, v, f, t and row.
  if (j - from === 1) {
    const ch = s.charCodeAt(from);
    if (ch === 99) return 'c';
    if (ch === 118) return 'v';
    if (ch === 102) return 'f';
    if (ch === 116) return 't';
  } else if (j - from === 3 && s.charCodeAt(from) === 114 && s.charCodeAt(from + 1) === 111 && s.charCodeAt(from + 2) === 119) return 'row';
  const name = s.slice(from, j);
  const colon = name.indexOf(':');
  return colon < 0 ? name : name.slice(colon + 1);
}

/** The attributes r, t and s of a tag (unprefixed only), read in one pass. */
interface CellAttributes {
  r: string | undefined;
  t: string | undefined;
  s: string | undefined;
}

function readAttributes(s: string, from: number, end: number, out: CellAttributes, damaged: ScanContext['damaged']): void {
  out.r = undefined;
  out.t = undefined;
  out.s = undefined;
  // Past the tag's name (which may carry a prefix).
  let j = from;
  while (j < end) {
    const ch = s.charCodeAt(j);
    if (ch === 32 || ch === 9 || ch === 10 || ch === 13 || ch === SLASH) break;
    j++;
  }
  for (;;) {
    while (j < end) {
      const ch = s.charCodeAt(j);
      if (ch !== 32 && ch !== 9 && ch !== 10 && ch !== 13) break;
      j++;
    }
    if (j >= end || s.charCodeAt(j) === SLASH) return;
    const eq = s.indexOf('=', j);
    if (eq < 0 || eq >= end) throw damaged('an attribute without a value');
    // The attribute name, without a slice for the common one-letter names r, t and s.
    let ne = eq;
    while (ne > j && s.charCodeAt(ne - 1) <= 32) ne--;
    const one = ne - j === 1 ? s.charCodeAt(j) : 0;
    const name = one === 114 ? 'r' : one === 116 ? 't' : one === 115 ? 's' : '';
    let q = eq + 1;
    while (q < end && s.charCodeAt(q) !== DQUOTE && s.charCodeAt(q) !== SQUOTE) {
      const ch = s.charCodeAt(q);
      if (ch !== 32 && ch !== 9 && ch !== 10 && ch !== 13) throw damaged('an attribute value without quotes');
      q++;
    }
    if (q >= end) throw damaged('an attribute value without quotes');
    const close = s.indexOf(s[q]!, q + 1);
    if (close < 0 || close >= end) throw damaged('an attribute value never closed');
    if (name === 'r' || name === 't' || name === 's') out[name] = decodeEntities(s.slice(q + 1, close), damaged);
    j = close + 1;
  }
}

/** The 0-based column of a cell reference such as "AB12" (letters then digits); `otherwise` when it is not one. */
function columnOf(ref: string, otherwise: number): number {
  let col = 0;
  let i = 0;
  for (; i < ref.length && i < 4; i++) {
    let ch = ref.charCodeAt(i);
    if (ch >= 97 && ch <= 122) ch -= 32;
    if (ch < 65 || ch > 90) break;
    col = col * 26 + (ch - 64);
  }
  if (i === 0 || i > 3 || i === ref.length) return otherwise;
  for (let j = i; j < ref.length; j++) {
    const ch = ref.charCodeAt(j);
    if (ch < 48 || ch > 57) return otherwise;
  }
  return col - 1;
}

const MS_PER_DAY = 86_400_000;

/**
 * A date serial number as ISO 8601 text: date, date and time, or time alone (serials below 1). The 1900 date system
 * counts 1900-01-01 as day 1 and keeps the fictitious 1900-02-29 as day 60 (ECMA-376 Part 1, §18.17.4.1); the 1904
 * system counts 1904-01-01 as day 0. Times are rounded to the second.
 */
export function serialToIso(serial: number, date1904: boolean): string {
  if (!Number.isFinite(serial) || serial < 0) return formatNumber(String(serial));
  let days = Math.floor(serial);
  let seconds = Math.round((serial - days) * 86400);
  if (seconds === 86400) {
    days += 1;
    seconds = 0;
  }
  const two = (n: number) => String(n).padStart(2, '0');
  const time = `${two(Math.floor(seconds / 3600))}:${two(Math.floor((seconds % 3600) / 60))}:${two(seconds % 60)}`;
  if (days === 0 && !date1904) return time;
  let date: string;
  if (!date1904 && days === 60) date = '1900-02-29';
  else {
    const epoch = date1904 ? Date.UTC(1904, 0, 1) : days < 60 ? Date.UTC(1899, 11, 31) : Date.UTC(1899, 11, 30);
    date = new Date(epoch + days * MS_PER_DAY).toISOString().slice(0, 10);
  }
  return seconds === 0 ? date : `${date} ${time}`;
}

/**
 * Scanner state for one worksheet. `feed` takes the next piece of decoded XML and returns the rows completed by it;
 * `finish` checks that the part ended cleanly and returns any last rows.
 */
/** The most text carried between pieces of a sheet part (one unfinished tag or value). */
const MAX_CARRIED = 4 * 1024 * 1024;

export class SheetScanner {
  private pending = '';
  private out: SheetRow[] = [];
  private rowNumber = 0;
  private inRow = false;
  private values: string[] = [];
  private col = -1;
  private inCell = false;
  private type = 'n';
  private style = -1;
  private hasFormula = false;
  private hasValue = false;
  private v = '';
  private inline = '';
  private collect: 0 | 1 | 2 = 0; // 0 none, 1 v, 2 inline t
  private inInline = false;
  private phonetic = 0;
  private readonly attrs: CellAttributes = { r: undefined, t: undefined, s: undefined };

  constructor(private readonly ctx: ScanContext) {}

  /** True between rows with nothing carried over: `feedBytes` may take over from here. */
  idle(): boolean {
    return this.pending.length === 0 && !this.inRow && !this.inCell && this.collect === 0 && !this.inInline && this.phonetic === 0;
  }

  /**
   * Read whole rows straight from the sheet's bytes, from `from` while the scanner is idle, as long as each row is
   * written in the plainest form: `<row` with attributes in double quotes, then only cells as `plainCell` reads them
   * whose value is a shared string index or a whole number not shown as a date, then `</row>`, with nothing else
   * between (no spaces, no other element). Bytes are compared as ASCII; any byte outside it, or anything else at all,
   * stops the fast read at the start of that row. Returns where it stopped (the caller decodes the rest as text and
   * hands it to `feed`); the rows read are handed out with the next `feed` or `takeRows`.
   */
  feedBytes(b: Uint8Array, from: number, end: number): number {
    let p = from;
    const shared = this.ctx.shared;
    const dateStyles = this.ctx.dateStyles;
    for (;;) {
      if (p + 6 > end || b[p] !== LT || b[p + 1] !== 114 || b[p + 2] !== 111 || b[p + 3] !== 119) return p;
      let q = p + 4;
      let rowNumber = -1;
      // The row's attributes: only r matters (as `open` reads it); the others are passed over.
      for (;;) {
        if (q >= end) return p;
        const c = b[q]!;
        if (c === GT) {
          q += 1;
          break;
        }
        if (c !== 32) return p;
        q += 1;
        const nameFrom = q;
        while (q < end && b[q]! > 32 && b[q] !== 61 && b[q] !== GT && b[q] !== SLASH && b[q]! < 128) q++;
        if (q + 1 >= end || q === nameFrom || b[q] !== 61 || b[q + 1] !== DQUOTE) return p;
        const vFrom = q + 2;
        let v = vFrom;
        let digits = true;
        let x = 0;
        for (; v < end; v++) {
          const ch = b[v]!;
          if (ch === DQUOTE) break;
          if (ch === 38 || ch === LT || ch >= 128) return p;
          if (ch >= 48 && ch <= 57) x = x * 10 + (ch - 48);
          else digits = false;
        }
        if (v >= end) return p;
        if (q - nameFrom === 1 && b[nameFrom] === 114) rowNumber = digits && v - vFrom >= 1 && v - vFrom <= 9 ? x : -1;
        q = v + 1;
      }
      // The cells, then '</row>'.
      const values: string[] = [];
      let col = -1;
      for (;;) {
        if (q + 6 > end || b[q] !== LT) return p;
        if (b[q + 1] === SLASH) {
          if (b[q + 2] !== 114 || b[q + 3] !== 111 || b[q + 4] !== 119 || b[q + 5] !== GT) return p;
          q += 6;
          break;
        }
        if (b[q + 1] !== 99 || b[q + 2] !== 32) return p;
        let j = q + 3;
        let next = col + 1;
        let isShared = false;
        let style = -1;
        for (;;) {
          if (j + 4 >= end) return p;
          const name = b[j]!;
          if (name === GT) break;
          if (b[j + 1] !== 61 || b[j + 2] !== DQUOTE) return p;
          const vFrom = j + 3;
          let v = vFrom;
          while (v < end && b[v] !== DQUOTE) v++;
          if (v >= end) return p;
          if (name === 114) {
            let k = vFrom;
            let c = 0;
            for (; k < v && k - vFrom < 4; k++) {
              let ch = b[k]!;
              if (ch >= 97 && ch <= 122) ch -= 32;
              if (ch < 65 || ch > 90) break;
              c = c * 26 + (ch - 64);
            }
            if (k - vFrom === 0 || k - vFrom > 3 || k === v) return p;
            for (; k < v; k++) if (b[k]! < 48 || b[k]! > 57) return p;
            next = c - 1;
          } else if (name === 116) {
            if (v - vFrom !== 1) return p;
            if (b[vFrom] === 115) isShared = true;
            else if (b[vFrom] !== 110) return p;
          } else if (name === 115) {
            if (v - vFrom < 1 || v - vFrom > 6) return p;
            let x = 0;
            for (let k = vFrom; k < v; k++) {
              const ch = b[k]!;
              if (ch < 48 || ch > 57) return p;
              x = x * 10 + (ch - 48);
            }
            style = x;
          } else return p;
          j = v + 1;
          if (b[j] !== 32 && b[j] !== GT) return p;
          if (b[j] === 32) j += 1;
        }
        // j at the cell tag's '>': then '<v>', digits, '</v></c>'.
        if (j + 4 >= end || b[j + 1] !== LT || b[j + 2] !== 118 || b[j + 3] !== GT) return p;
        const vFrom = j + 4;
        let k = vFrom;
        let x = 0;
        for (; k < end; k++) {
          const ch = b[k]!;
          if (ch < 48 || ch > 57) break;
          x = x * 10 + (ch - 48);
        }
        const len = k - vFrom;
        if (len < 1 || len > 9 || k + 8 > end) return p;
        if (b[k] !== LT || b[k + 1] !== SLASH || b[k + 2] !== 118 || b[k + 3] !== GT || b[k + 4] !== LT || b[k + 5] !== SLASH || b[k + 6] !== 99 || b[k + 7] !== GT) return p;
        if (next > 16383) return p;
        let text: string | undefined;
        if (isShared) text = shared[x];
        else if (!(style >= 0 && dateStyles[style] === true) && (b[vFrom] !== 48 || len === 1)) text = x < SMALL_NUMBERS ? smallNumber(x) : String(x);
        if (text === undefined) return p;
        while (values.length < next) values.push('');
        values[next] = text;
        col = next;
        q = k + 8;
      }
      this.rowNumber = rowNumber >= 0 ? rowNumber : this.rowNumber + 1;
      this.out.push({ row: this.rowNumber, values });
      p = q;
    }
  }

  /** Rows completed so far (by `feedBytes`), handed out once. */
  takeRows(): SheetRow[] {
    return this.out.splice(0);
  }

  feed(text: string): SheetRow[] {
    this.pending = this.pending.length === 0 ? text : this.pending + text;
    this.scan(false);
    // What is carried is at most one unfinished tag or value: a spreadsheet cell holds at most 32,767 characters.
    if (this.pending.length > MAX_CARRIED) throw this.ctx.damaged('a value or a tag runs on for more than 4 million characters');
    return this.out.splice(0);
  }

  finish(): SheetRow[] {
    this.scan(true);
    if (this.pending.trim() !== '') throw this.ctx.damaged('the part ends in the middle of a tag');
    if (this.inRow || this.inCell) throw this.ctx.damaged(`the part ends inside ${this.inCell ? 'a cell' : 'a row'}`);
    return this.out.splice(0);
  }

  private scan(final: boolean): void {
    const s = this.pending;
    const n = s.length;
    const damaged = this.ctx.damaged;
    let i = 0;
    while (i < n) {
      if (s.charCodeAt(i) !== LT) {
        let j = s.indexOf('<', i);
        if (j < 0) {
          if (!final) {
            // Text outside any value is passed over now rather than carried (a run of filler would be rescanned).
            if (this.collect === 0) i = n;
            break;
          }
          j = n;
        }
        if (this.collect !== 0) this.text(decodeEntities(s.slice(i, j), damaged));
        i = j;
        continue;
      }
      const c1 = i + 1 < n ? s.charCodeAt(i + 1) : -1;
      if (c1 === -1) break;
      if (c1 === BANG) {
        if (s.startsWith('<!--', i)) {
          const e = s.indexOf('-->', i + 4);
          if (e < 0) break;
          i = e + 3;
          continue;
        }
        if (s.startsWith('<![CDATA[', i)) {
          const e = s.indexOf(']]>', i + 9);
          if (e < 0) break;
          if (this.collect !== 0) this.text(s.slice(i + 9, e));
          i = e + 3;
          continue;
        }
        if (n - i < 9 && !final) break;
        throw damaged('a document type or other declaration inside the sheet');
      }
      if (c1 === QUESTION) {
        const e = s.indexOf('?>', i + 2);
        if (e < 0) break;
        i = e + 2;
        continue;
      }
      // The common cell, `<c r="B7" t="s" s="3"><v>12</v></c>`, read in one go; anything else takes the general path.
      if (c1 === 99 && this.inRow && !this.inCell) {
        const past = this.plainCell(s, i, n);
        if (past > 0) {
          i = past;
          continue;
        }
      }
      // A tag: find its '>' outside quoted attribute values.
      let e = i + 1;
      let quote = 0;
      for (; e < n; e++) {
        const ch = s.charCodeAt(e);
        if (quote !== 0) {
          if (ch === quote) quote = 0;
        } else if (ch === DQUOTE || ch === SQUOTE) quote = ch;
        else if (ch === GT) break;
        else if (ch === LT) throw damaged('a "<" inside a tag');
      }
      if (e >= n) break;
      if (c1 === SLASH) this.close(tagName(s, i + 2, e));
      else {
        const selfClosing = s.charCodeAt(e - 1) === SLASH;
        const name = tagName(s, i + 1, selfClosing ? e - 1 : e);
        if (name === '') throw damaged('a tag with no name');
        this.open(name, s, i + 1, selfClosing ? e - 1 : e);
        if (selfClosing) this.close(name);
      }
      i = e + 1;
    }
    this.pending = i >= n ? '' : s.slice(i);
  }

  /**
   * A cell written in the plainest form: `<c` then only the unprefixed attributes r, t and s in double quotes with no
   * references, then `<v>`, a value with no '&' or '<', and `</v></c>`. Such a cell is set up exactly as `open` and
   * the value as `text` would, and closed through `close`, so both paths give the same text and the same errors.
   * Returns the index past `</c>`, or 0 when the cell is written any other way or is not complete in `s` yet (the
   * general path then reads it).
   */
  private plainCell(s: string, i: number, n: number): number {
    let j = i + 2;
    if (j >= n || s.charCodeAt(j) !== 32) return 0;
    let col = this.col + 1;
    let type = 'n';
    let style = -1;
    for (;;) {
      while (j < n && s.charCodeAt(j) === 32) j++;
      if (j + 4 >= n) return 0;
      const name = s.charCodeAt(j);
      if (name === GT) break;
      if (s.charCodeAt(j + 1) !== 61 || s.charCodeAt(j + 2) !== DQUOTE) return 0; // name="
      const from = j + 3;
      let close = from;
      while (close < n && s.charCodeAt(close) !== DQUOTE) close++;
      if (close >= n) return 0;
      if (name === 114) {
        // r: column letters then row digits.
        let k = from;
        let c = 0;
        for (; k < close && k - from < 4; k++) {
          let ch = s.charCodeAt(k);
          if (ch >= 97 && ch <= 122) ch -= 32;
          if (ch < 65 || ch > 90) break;
          c = c * 26 + (ch - 64);
        }
        const letters = k - from;
        if (letters === 0 || letters > 3 || k === close) return 0;
        for (; k < close; k++) {
          const ch = s.charCodeAt(k);
          if (ch < 48 || ch > 57) return 0;
        }
        col = c - 1;
      } else if (name === 116) {
        // t: the common one-letter types without a new string.
        if (close - from === 1) {
          const ch = s.charCodeAt(from);
          type = ch === 115 ? 's' : ch === 110 ? 'n' : ch === 98 ? 'b' : ch === 101 ? 'e' : ch === 100 ? 'd' : s.slice(from, close);
        } else {
          for (let k = from; k < close; k++) if (s.charCodeAt(k) === 38) return 0;
          type = s.slice(from, close);
        }
      } else if (name === 115) {
        // s: a style index of 1 to 6 digits, as `open` reads it; anything else takes the general path.
        if (close - from < 1 || close - from > 6) return 0;
        let x = 0;
        for (let k = from; k < close; k++) {
          const ch = s.charCodeAt(k);
          if (ch < 48 || ch > 57) return 0;
          x = x * 10 + (ch - 48);
        }
        style = x;
      } else return 0;
      j = close + 1;
      const after = s.charCodeAt(j);
      if (after !== 32 && after !== GT) return 0;
    }
    // j is at '>' of the cell tag: then <v>value</v></c>.
    if (j + 4 >= n || s.charCodeAt(j + 1) !== LT || s.charCodeAt(j + 2) !== 118 || s.charCodeAt(j + 3) !== GT) return 0;
    const from = j + 4;
    let k = from;
    let digits = true;
    let whole = 0;
    for (; k < n; k++) {
      const ch = s.charCodeAt(k);
      if (ch === LT) break;
      if (ch === 38) return 0;
      if (ch >= 48 && ch <= 57) whole = whole * 10 + (ch - 48);
      else digits = false;
    }
    // '</v></c>', compared a character at a time (a call to startsWith costs more than the comparisons).
    if (
      k + 8 > n ||
      s.charCodeAt(k + 1) !== SLASH ||
      s.charCodeAt(k + 2) !== 118 ||
      s.charCodeAt(k + 3) !== GT ||
      s.charCodeAt(k + 4) !== LT ||
      s.charCodeAt(k + 5) !== SLASH ||
      s.charCodeAt(k + 6) !== 99 ||
      s.charCodeAt(k + 7) !== GT
    ) {
      return 0;
    }
    if (col > 16383) return 0;
    // The two commonest cells, a shared string and a whole number not shown as a date, straight into the row.
    const len = k - from;
    if (digits && len > 0 && len <= 9) {
      let text: string | undefined;
      if (type === 's') text = this.ctx.shared[whole];
      else if (type === 'n' && !(style >= 0 && this.ctx.dateStyles[style] === true) && (s.charCodeAt(from) !== 48 || len === 1)) text = s.slice(from, k);
      if (text !== undefined) {
        this.col = col;
        const values = this.values;
        while (values.length < col) values.push('');
        values[col] = text;
        return k + 8;
      }
    }
    this.col = col;
    this.type = type;
    this.style = style;
    this.hasFormula = false;
    this.hasValue = true;
    this.inline = '';
    this.v = s.slice(from, k);
    this.inCell = true;
    this.close('c');
    return k + 8;
  }

  private text(t: string): void {
    if (this.collect === 1) this.v += t;
    else this.inline += t;
  }

  private open(name: string, s: string, attrFrom: number, attrEnd: number): void {
    switch (name) {
      case 'row': {
        if (this.inRow) throw this.ctx.damaged('a row inside a row');
        readAttributes(s, attrFrom, attrEnd, this.attrs, this.ctx.damaged);
        const r = this.attrs.r;
        this.rowNumber = r !== undefined && /^\d{1,9}$/.test(r) ? Number(r) : this.rowNumber + 1;
        this.inRow = true;
        this.values = [];
        this.col = -1;
        break;
      }
      case 'c': {
        if (!this.inRow || this.inCell) throw this.ctx.damaged('a cell outside a row');
        readAttributes(s, attrFrom, attrEnd, this.attrs, this.ctx.damaged);
        const r = this.attrs.r;
        this.col = r === undefined ? this.col + 1 : columnOf(r, this.col + 1);
        if (this.col > 16383) throw this.ctx.damaged(`a cell beyond the last column (${r ?? ''})`);
        this.type = this.attrs.t ?? 'n';
        this.style = this.attrs.s !== undefined && /^\d{1,6}$/.test(this.attrs.s) ? Number(this.attrs.s) : -1;
        this.hasFormula = false;
        this.hasValue = false;
        this.v = '';
        this.inline = '';
        this.inCell = true;
        break;
      }
      case 'f':
        this.hasFormula = true;
        break;
      case 'v':
        if (this.inCell) {
          this.hasValue = true;
          this.collect = 1;
        }
        break;
      case 'is':
        this.inInline = true;
        break;
      case 'rPh':
        this.phonetic += 1;
        break;
      case 't':
        if (this.inInline && this.phonetic === 0) this.collect = 2;
        break;
    }
  }

  private fail(problem: string, found: string, fix: string): never {
    const ref = `${columnLetters(this.col)}${this.rowNumber}`;
    throw new InputError({ file: this.ctx.file, sheet: this.ctx.sheet, row: this.rowNumber, field: `cell ${ref}`, found, problem, fix });
  }

  private close(name: string): void {
    switch (name) {
      case 'v':
      case 't':
        this.collect = 0;
        break;
      case 'is':
        this.inInline = false;
        break;
      case 'rPh':
        this.phonetic = Math.max(0, this.phonetic - 1);
        break;
      case 'c': {
        if (!this.inCell) throw this.ctx.damaged('a cell closed that was never opened');
        this.inCell = false;
        this.collect = 0;
        if (this.hasFormula && !this.hasValue) {
          this.fail(
            'A formula cell has no saved result, and warrant does not calculate formulas',
            'a formula with no cached value',
            'Open the workbook in a spreadsheet program, let it calculate, and save it; or paste the values in place of the formulas',
          );
        }
        let text: string;
        switch (this.type) {
          case 's': {
            const t = this.v.trim();
            const k = /^\d{1,9}$/.test(t) ? Number(t) : -1;
            const found = k >= 0 ? this.ctx.shared[k] : undefined;
            if (found === undefined) {
              this.fail('The cell refers to a shared string that the workbook does not have', this.v, 'Open the workbook in a spreadsheet program and save it again as .xlsx');
            }
            text = found!;
            break;
          }
          case 'inlineStr':
            text = this.hasValue ? this.v : this.inline;
            break;
          case 'b': {
            const t = this.v.trim();
            text = t === '1' ? 'TRUE' : t === '0' ? 'FALSE' : this.v;
            break;
          }
          case 'n':
            text =
              this.style >= 0 && this.ctx.dateStyles[this.style] === true && this.v.trim() !== '' && Number.isFinite(Number(this.v))
                ? serialToIso(Number(this.v), this.ctx.date1904)
                : formatNumber(this.v);
            break;
          default: // str, e, d
            text = this.v;
        }
        const values = this.values;
        while (values.length < this.col) values.push('');
        values[this.col] = text;
        break;
      }
      case 'row':
        if (!this.inRow) throw this.ctx.damaged('a row closed that was never opened');
        if (this.inCell) throw this.ctx.damaged('a row closed inside a cell');
        this.inRow = false;
        this.out.push({ row: this.rowNumber, values: this.values });
        this.values = [];
        break;
    }
  }
}

/**
 * Number format ids built into the format (ECMA-376 Part 1, §18.8.30 numFmt) that show dates or times: 14-22 and
 * 45-47, and the East Asian date formats 27-36 and 50-58.
 */
export function isBuiltInDateFormat(id: number): boolean {
  return (id >= 14 && id <= 22) || (id >= 27 && id <= 36) || (id >= 45 && id <= 47) || (id >= 50 && id <= 58);
}

/**
 * True when a custom number format code shows a date or time: it has d, m, y, h or s outside quoted text, escaped
 * characters and bracketed sections (colours, conditions, locales), other than in the elapsed-time forms. Common
 * practice for format codes (ECMA-376 Part 1, §18.8.31 numFmts).
 */
export function isDateFormatCode(code: string): boolean {
  const section = code.split(';')[0] ?? '';
  const bare = section
    .replace(/"[^"]*"/g, '')
    .replace(/\\./g, '')
    .replace(/_./g, '')
    .replace(/\*./g, '')
    .replace(/\[(h+|m+|s+)\]/gi, 'h')
    .replace(/\[[^\]]*\]/g, '');
  if (/general/i.test(bare)) return false;
  return /[dmyhs]/i.test(bare);
}
