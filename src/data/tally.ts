/**
 * Respondent lines tallied straight from a CSV file's bytes: the part of respondentsCube (cube.ts) that both the main
 * thread and a reading worker (read-worker.ts) run, so that the two count alike.
 *
 * A line is taken when it is plainly regular: fields end at the delimiter, the line at a line feed (for crlf, a
 * carriage return then a line feed); a field may be quoted ("Łąka, Cwm"), its value then being what lies between the
 * quotes. Anything else stops the read at that line's start, for the reader's other paths: a doubled quote inside a
 * quoted value, a quote inside an unquoted value, text after a closing quote, a line break inside quotes, a line feed
 * alone in a crlf file. Each field's place in the line is noted by its column's role; single-digit answers are counted
 * from their byte, any other answer is handed over as text; a group is found by the bytes of its values, and made from
 * their text (trimmed as dimText trims) on first sight.
 */

/** What an answer comes to: a code (1 and up), or one of these. */
export const NA_ANSWER = -2;
export const BLANK_ANSWER = -3;

/** Groups remembered by the bytes of their values; past this, new ones are looked up by text. */
const BYTE_GROUP_LIMIT = 1 << 16;

/** One-character strings for the ASCII bytes. */
export const ASCII_TEXT = Array.from({ length: 128 }, (_, i) => String.fromCharCode(i));

/** Ends each value in a group's byte key: a byte that never occurs in well-formed UTF-8. */
const KEY_END = 0xff;

/** A group value as read: trimmed when it starts or ends with a space or control character. */
export function dimText(v0: string): string {
  return v0.length > 0 && (v0.charCodeAt(0) <= 32 || v0.charCodeAt(v0.length - 1) <= 32) ? v0.trim() : v0;
}

/** Why the last codeOfText call returned -1, and the text it read (trimmed): kept here, so that no object is made per answer. */
export const codeWrong = { why: '' as '' | 'not-code' | 'range', raw: '' };

/**
 * The code an answer's text stands for, or NA_ANSWER, BLANK_ANSWER, or -1 when it is not a whole number or out of
 * range (codeWrong then says which): the rule of respondent data, one place for every reader.
 */
export function codeOfText(raw0: string, maxCode: number, isNa: (c: number) => boolean): number {
  if (raw0 === '') return BLANK_ANSWER;
  let code: number;
  let raw = raw0;
  const c0 = raw0.charCodeAt(0);
  if (raw0.length === 1 && c0 >= 48 && c0 <= 57) code = c0 - 48;
  else {
    raw = raw0.trim();
    if (raw === '') return BLANK_ANSWER;
    code = /^[+-]?\d+(\.0+)?$/.test(raw) ? Number(raw) : NaN;
  }
  if (Number.isNaN(code)) {
    codeWrong.why = 'not-code';
    codeWrong.raw = raw;
    return -1;
  }
  if (isNa(code)) return NA_ANSWER;
  if (code < 1 || code > maxCode) {
    codeWrong.why = 'range';
    codeWrong.raw = raw;
    return -1;
  }
  return code;
}

/** Groups per block of a TallyStore. */
const BLOCK_SHIFT = 8;
const BLOCK_GROUPS = 1 << BLOCK_SHIFT;

/**
 * Answer counts of every (group, question) in typed arrays, a block per 256 groups: per pair, the counts of codes
 * 0..maxCode, then not applicable, blank, the order in which the pair got its first valid answer (1 and up; 0 for
 * none yet) and that answer's row. Groups are numbered as made. Blocks are added, never copied into a larger array:
 * fresh memory is slow to touch on a busy machine (each new page costs a fault), so only what is used is touched.
 */
export class TallyStore {
  readonly stride: number;
  readonly na: number;
  readonly blank: number;
  readonly seq: number;
  readonly firstRow: number;
  readonly blocks: Int32Array[] = [];
  groups = 0;
  validSeen = 0;
  constructor(
    readonly maxCode: number,
    readonly questions: number,
  ) {
    this.stride = maxCode + 5;
    this.na = maxCode + 1;
    this.blank = maxCode + 2;
    this.seq = maxCode + 3;
    this.firstRow = maxCode + 4;
  }
  /** A new group's number. */
  newGroup(): number {
    if ((this.groups & (BLOCK_GROUPS - 1)) === 0) this.blocks.push(new Int32Array(BLOCK_GROUPS * this.questions * this.stride));
    return this.groups++;
  }
  /** The block holding group g's counts. */
  block(g: number): Int32Array {
    return this.blocks[g >> BLOCK_SHIFT]!;
  }
  /** Where the counts of question k of group g begin in its block. */
  at(g: number, k: number): number {
    return ((g & (BLOCK_GROUPS - 1)) * this.questions + k) * this.stride;
  }
  /** Every group's counts in one array, group after group. */
  flat(): Int32Array {
    const size = this.questions * this.stride;
    const out = new Int32Array(this.groups * size);
    this.blocks.forEach((b, i) => out.set(b.subarray(0, Math.min(BLOCK_GROUPS, this.groups - i * BLOCK_GROUPS) * size), i * BLOCK_GROUPS * size));
    return out;
  }
  /** Count an answer of question k in group g: a code, NA_ANSWER or BLANK_ANSWER. */
  count(g: number, k: number, code: number, row: number): void {
    const at = ((g & (BLOCK_GROUPS - 1)) * this.questions + k) * this.stride;
    const data = this.blocks[g >> BLOCK_SHIFT]!;
    if (code >= 0) {
      data[at + code]! += 1;
      if (data[at + this.seq] === 0) {
        data[at + this.seq] = ++this.validSeen;
        data[at + this.firstRow] = row;
      }
    } else data[at + (code === NA_ANSWER ? this.na : this.blank)]! += 1;
  }
}

/** The columns a tally reads, and what a single-digit answer does. Plain data, so that it can be posted to a worker. */
export interface TallyPlan {
  /** Columns in the header. */
  columns: number;
  /** Column of each question. */
  qIdx: number[];
  /** Column of each group dimension. */
  dimIdx: number[];
  /** By digit 0-9: 1 counted, 0 not applicable, -1 out of range (handed over as text, for the problem it is). */
  digitDoes: number[];
}

/** Where the tally goes: groups made from their values' text (numbered in a TallyStore), answers counted there. */
export interface TallyTarget {
  /** The group of these values (trimmed with dimText), made on first sight. */
  group(values: string[]): number;
  /** The code of an answer's text other than one digit or blank (see codeOfText); -1 when it is a problem. */
  code(text: string, row: number, k: number): number;
}

export interface ByteLines {
  /**
   * Tally the lines of b[from, end), where `end` is just past a line feed, numbered from `firstRow`; returns where it
   * stopped (`end`, or the start of a line it leaves to the other paths) and how many lines it took.
   */
  lines(b: Uint8Array, from: number, end: number, crlf: boolean, d: number, firstRow: number): { at: number; rows: number };
  /** Lines taken that were not blank (rows with data). */
  dataRows: number;
}

export function byteLines(plan: TallyPlan, target: TallyTarget, store: TallyStore): ByteLines {
  const { qIdx, dimIdx } = plan;
  const nq = qIdx.length;
  const nd = dimIdx.length;
  const digitDoes = Int8Array.from(plan.digitDoes);
  const role = new Int32Array(plan.columns).fill(-1); // question k as k, group column j as -2 - j, others -1
  qIdx.forEach((i, k) => {
    role[i] = k;
  });
  dimIdx.forEach((i, j) => {
    role[i] = -2 - j;
  });
  const lastDim = nd > 0 ? Math.max(...dimIdx) : -1;
  const qFrom = new Int32Array(nq);
  const qTo = new Int32Array(nq);
  const dFrom = new Int32Array(nd);
  const dTo = new Int32Array(nd);
  const dHash = new Int32Array(nd);
  // Groups by the bytes of their values: an open-addressing table of slots (entry + 1, 0 for free) over entries each
  // with the full hash, the values' bytes (each ended by KEY_END) and the group.
  // The slots double (rehashed from the entries' hashes) when half full, so a file with few groups touches little.
  let slotMask = (1 << 10) - 1;
  let slots = new Int32Array(slotMask + 1);
  const slotHash = new Int32Array(BYTE_GROUP_LIMIT);
  const slotKey: Uint8Array[] = [];
  const slotGroup: number[] = [];
  const dimValues: string[] = new Array<string>(nd).fill('');
  const text = (b: Uint8Array, s: number, e: number): string => Buffer.from(b.buffer, b.byteOffset + s, e - s).toString('utf8');
  const sameKey = (key: Uint8Array, b: Uint8Array): boolean => {
    let at = 0;
    for (let j = 0; j < nd; j++) {
      const e = dTo[j]!;
      for (let i = dFrom[j]!; i < e; i++) if (key[at++] !== b[i]) return false;
      if (key[at++] !== KEY_END) return false;
    }
    return at === key.length;
  };
  const groupOfBytes = (b: Uint8Array): number => {
    // The line's values, each hashed as it was read (dHash), combined in order.
    let h = 0;
    let len = 0;
    for (let j = 0; j < nd; j++) {
      h = (Math.imul(h, 0x01000193) ^ dHash[j]!) | 0;
      len += dTo[j]! - dFrom[j]! + 1;
    }
    let slot = (h ^ (h >>> 15)) & slotMask;
    for (;;) {
      const entry = slots[slot]! - 1;
      if (entry < 0) break;
      if (slotHash[entry] === h && sameKey(slotKey[entry]!, b)) return slotGroup[entry]!;
      slot = (slot + 1) & slotMask;
    }
    for (let j = 0; j < nd; j++) dimValues[j] = dimText(text(b, dFrom[j]!, dTo[j]!));
    const group = target.group(dimValues);
    const entry = slotGroup.length;
    if (entry < BYTE_GROUP_LIMIT) {
      const key = new Uint8Array(len);
      let at = 0;
      for (let j = 0; j < nd; j++) {
        key.set(b.subarray(dFrom[j]!, dTo[j]!), at);
        at += dTo[j]! - dFrom[j]!;
        key[at++] = KEY_END;
      }
      slotHash[entry] = h;
      slotKey.push(key);
      slotGroup.push(group);
      slots[slot] = entry + 1;
      if ((entry + 1) * 2 > slotMask) {
        slotMask = slotMask * 2 + 1;
        slots = new Int32Array(slotMask + 1);
        for (let e = 0; e <= entry; e++) {
          const eh = slotHash[e]!;
          let at = (eh ^ (eh >>> 15)) & slotMask;
          while (slots[at] !== 0) at = (at + 1) & slotMask;
          slots[at] = e + 1;
        }
      }
    }
    return group;
  };
  const out = { at: 0, rows: 0 };
  const sink: ByteLines = {
    dataRows: 0,
    lines(b, from, end, crlf, d, firstRow) {
      const nc = role.length;
      let row = firstRow;
      let at = from;
      let dataRows = 0;
      const done = () => {
        sink.dataRows += dataRows;
        out.at = at;
        out.rows = row - firstRow;
        return out;
      };
      // Field by field: `end` is just past a line feed, so each scan stops at one without checking `end`.
      while (at < end) {
        // Fields past the line's last (col at its end) are missing: answers not read, group values ''.
        let col = 0;
        let s = at;
        let blank = true;
        let wide = false;
        let quoted = false;
        let stop: number;
        for (;;) {
          const r = col < nc ? role[col]! : -1;
          let i = s;
          let c = b[i]!;
          // A group value's bytes are hashed as they are passed (see groupOfBytes).
          let h = 0;
          let e: number;
          if (c === 34) {
            // A quoted value: up to the next quote, which must end the field; its bytes are the value.
            quoted = true;
            s = i + 1;
            c = b[++i]!;
            if (r < -1) {
              while (c !== 34 && c !== 10 && c !== 13) {
                h = (Math.imul(h, 31) + c) | 0;
                c = b[++i]!;
              }
            } else while (c !== 34 && c !== 10 && c !== 13) c = b[++i]!;
            if (c !== 34) return done();
            e = i;
            c = b[++i]!;
            if (c !== d && c !== 10 && c !== 13) return done();
            if (c === 13 && !(crlf && b[i + 1] === 10)) return done();
          } else {
            if (r < -1) {
              while (c !== d && c !== 10 && c !== 13 && c !== 34) {
                h = (Math.imul(h, 31) + c) | 0;
                c = b[++i]!;
              }
            } else while (c !== d && c !== 10 && c !== 13 && c !== 34) c = b[++i]!;
            if (c === 13 && !(crlf && b[i + 1] === 10)) {
              // A carriage return inside a field (not a line end here): part of the field.
              c = b[++i]!;
              while (c !== d && c !== 10 && c !== 34 && (c !== 13 || !(crlf && b[i + 1] === 10))) c = b[++i]!;
              h = 0;
              if (r < -1) for (let k = s; k < i; k++) h = (Math.imul(h, 31) + b[k]!) | 0;
            }
            if (c === 34) return done();
            e = i;
          }
          if (c === 10 && crlf) return done();
          if (r >= 0) {
            qFrom[r] = s;
            qTo[r] = e;
          } else if (r < -1) {
            dFrom[-2 - r] = s;
            dTo[-2 - r] = e;
            dHash[-2 - r] = h;
          }
          if (blank) {
            for (let k = s; k < e; k++) {
              const x = b[k]!;
              if (x >= 128) wide = true;
              else if (x !== 32 && (x < 9 || x > 13)) {
                blank = false;
                break;
              }
            }
          }
          if (c !== d) {
            stop = i;
            break;
          }
          col += 1;
          s = i + 1;
        }
        if (blank && wide) {
          // Non-ASCII text in an otherwise blank line: decide on the decoded text, as isBlankRow would (a quoted
          // value may hold the delimiter: such a line is left to the other paths).
          if (quoted) return done();
          blank = text(b, at, stop).split(String.fromCharCode(d)).every((v) => v.trim() === '');
        }
        const lf = b[stop] === 13 ? stop + 1 : stop;
        if (!blank) {
          dataRows += 1;
          let group = -1;
          if (col < lastDim) {
            for (let j = 0; j < nd; j++) {
              if (dimIdx[j]! > col) {
                dFrom[j] = 0;
                dTo[j] = 0;
                dHash[j] = 0;
              }
            }
          }
          for (let k = 0; k < nq; k++) {
            if (qIdx[k]! > col) {
              if (group < 0) group = groupOfBytes(b);
              store.count(group, k, BLANK_ANSWER, row);
              continue;
            }
            const qs = qFrom[k]!;
            const qe = qTo[k]!;
            let code: number;
            const c = b[qs]!;
            if (qe - qs === 1 && c >= 48 && c <= 57) {
              code = c - 48;
              const does = digitDoes[code]!;
              if (does === 0) {
                if (group < 0) group = groupOfBytes(b);
                store.count(group, k, NA_ANSWER, row);
                continue;
              }
              if (does < 0) {
                target.code(ASCII_TEXT[c]!, row, k);
                continue;
              }
            } else if (qe === qs) code = BLANK_ANSWER;
            else {
              code = target.code(text(b, qs, qe), row, k);
              if (code === -1) continue;
            }
            if (group < 0) group = groupOfBytes(b);
            store.count(group, k, code, row);
          }
        }
        row += 1;
        at = lf + 1;
      }
      return done();
    },
  };
  return sink;
}

/** What a reading worker is given (read-worker.ts): the file's bytes [start, end), which begin at a line's start. */
export interface RangeJob {
  path: string;
  start: number;
  end: number;
  crlf: boolean;
  /** The delimiter's byte. */
  d: number;
  plan: TallyPlan;
  maxCode: number;
  notApplicable: number[];
}

/**
 * A range's tally: its groups' values (as dimText makes them), in the order of their numbers, and their counts laid
 * out as in a TallyStore of the same maxCode and questions, rows counted from the range's first line (0).
 * `rows`: lines with data.
 */
export type RangeTally = { taken: true; rows: number; values: string[][]; data: Int32Array } | { taken: false; why: string };

/** Longest line a range carries between reads before it leaves the file to the main reader. */
const RANGE_LINE_LIMIT = 1 << 20;

/**
 * Tally the lines of a range of a file with byteLines, or say why not: the range is taken only when every line is one
 * byteLines takes and every answer is a code, not applicable or blank (anything else, such as a problem to report
 * with its row, is left to the main reader, which reads the range itself).
 */
export async function tallyRange(job: RangeJob, readSize = 1 << 18): Promise<RangeTally> {
  const { open } = await import('node:fs/promises');
  const { isUtf8 } = await import('node:buffer');
  const store = new TallyStore(job.maxCode, job.plan.qIdx.length);
  const na = new Set(job.notApplicable);
  const isNa = (c: number) => na.has(c);
  const values: string[][] = [];
  let problem = '';
  const sink = byteLines(
    job.plan,
    {
      group: (v) => {
        values.push(v.slice());
        return store.newGroup();
      },
      code: (text) => {
        const c = codeOfText(text, job.maxCode, isNa);
        if (c === -1) problem = 'an answer that is not a code';
        return c;
      },
    },
    store,
  );
  const file = await open(job.path, 'r');
  try {
    let at = job.start;
    let row = 0;
    // One buffer for the whole range: the unfinished line is moved to its front, the next read goes after it.
    let buf = Buffer.allocUnsafe(readSize);
    let carried = 0;
    while (at < job.end) {
      if (carried === buf.length) {
        if (carried >= RANGE_LINE_LIMIT) return { taken: false, why: 'a very long line' };
        const bigger = Buffer.allocUnsafe(buf.length * 2);
        buf.copy(bigger, 0, 0, carried);
        buf = bigger;
      }
      const { bytesRead } = await file.read(buf, carried, Math.min(buf.length - carried, job.end - at), at);
      if (bytesRead === 0) return { taken: false, why: 'the file is shorter than it was' };
      at += bytesRead;
      const b = buf.subarray(0, carried + bytesRead);
      if (b.indexOf(0, carried) >= 0) return { taken: false, why: 'a NUL byte' };
      const last = b.lastIndexOf(10);
      if (last >= 0) {
        if (!isUtf8(b.subarray(0, last + 1))) return { taken: false, why: 'bytes that are not UTF-8' };
        const taken = sink.lines(b, 0, last + 1, job.crlf, job.d, row);
        row += taken.rows;
        if (problem !== '') return { taken: false, why: problem };
        if (taken.at <= last) return { taken: false, why: 'a line for the other paths' };
      }
      carried = b.length - (last + 1);
      b.copy(buf, 0, last + 1, b.length);
    }
    const carry = buf.subarray(0, carried);
    if (carry.length > 0) {
      // The last line, with no line break after it: read as if it had one (as the main reader reads it), unless it
      // holds a carriage return.
      if (carry.indexOf(13) >= 0) return { taken: false, why: 'a carriage return in the last line' };
      const b = Buffer.concat([carry, Buffer.from(job.crlf ? '\r\n' : '\n')]);
      if (!isUtf8(b)) return { taken: false, why: 'bytes that are not UTF-8' };
      const taken = sink.lines(b, 0, b.length, job.crlf, job.d, row);
      if (problem !== '') return { taken: false, why: problem };
      if (taken.at < b.length) return { taken: false, why: 'a line for the other paths' };
    }
    return { taken: true, rows: sink.dataRows, values, data: store.flat() };
  } finally {
    await file.close();
  }
}
