/**
 * Quick shaping of plain words: the glyphs and positions fontkit's layout gives a word, worked out without running
 * fontkit's shaper, for words whose shaping can only be one glyph per character plus pair kerning.
 *
 * fontkit shapes a word by running every substitution (GSUB) and positioning (GPOS) lookup of its default features
 * over the word: 30-100 microseconds a word, and far more for the first words (the lookups are read from the font
 * then), while a pack sets some 5,000 different words. Here the font's GSUB and GPOS tables are read straight from
 * its bytes, once, to find for every lookup those features use the glyphs that must all be present for it to change
 * anything (its coverage tables; for a ligature, also the glyphs that may follow the first). A word none of whose
 * lookups can fire, other than pair kerning, is shaped as fontkit would: one glyph per character (fontkit's own glyph
 * objects), each advancing by its width plus the kerning of the pairs it is in, read from the font's pair
 * adjustment tables as fontkit applies them (every pair lookup, in turn; in each, the first subtable that covers the
 * pair). Anything else — a character outside the plain ranges below, a mark, a ligature such as "fi", a font with
 * feature variations or unusual lookup flags — returns undefined, and fontkit shapes it.
 *
 * tests/render/shaping.test.ts checks the result against fontkit's layout for every pair of characters of a wide
 * set and for mixed text, in each face.
 */
import type * as fontkit from 'fontkit';

/** A position as fontkit gives it, in font units. */
export interface QuickPosition {
  xAdvance: number;
  yAdvance: number;
  xOffset: number;
  yOffset: number;
}

export interface QuickRun {
  glyphs: fontkit.Glyph[];
  positions: QuickPosition[];
}

/** Features fontkit's default shaper applies to left-to-right text (besides fractions, which need U+2044). */
const APPLIED = new Set(['rvrn', 'ltra', 'ltrm', 'ccmp', 'locl', 'rlig', 'mark', 'mkmk', 'calt', 'clig', 'liga', 'rclt', 'curs', 'kern']);

/**
 * Whether a features object asks for fontkit's defaults without kerning: kern false, nothing else false, and nothing
 * beyond the default features (fontkit writes the features it applied back into the object it is given).
 */
export function withoutKerning(features: unknown): boolean {
  if (typeof features !== 'object' || features === null || Array.isArray(features)) return false;
  const f = features as Record<string, unknown>;
  if (f.kern !== false) return false;
  for (const [tag, on] of Object.entries(f)) {
    if (tag === 'kern') continue;
    if (on !== true || !(APPLIED.has(tag) || tag === 'frac' || tag === 'numr' || tag === 'dnom')) return false;
  }
  return true;
}

/** Scripts fontkit may select for a word of Latin letters, digits and punctuation. */
const SCRIPTS = ['DFLT', 'dflt', 'latn'];

/** Plain characters: Latin letters, digits, punctuation and common symbols, without default-ignorables. */
function plainChar(c: number): boolean {
  return (
    (c >= 0x20 && c <= 0x7e) ||
    (c >= 0xa0 && c <= 0x24f && c !== 0xad) ||
    (c >= 0x1e00 && c <= 0x1eff) ||
    (c >= 0x2010 && c <= 0x2027) ||
    (c >= 0x2030 && c <= 0x205e && c !== 0x2044) ||
    (c >= 0x20a0 && c <= 0x20c0) ||
    c === 0x2122 ||
    c === 0x2190 ||
    c === 0x2192 ||
    c === 0x2212 ||
    c === 0x2248 ||
    c === 0x2260 ||
    c === 0x2264 ||
    c === 0x2265
  );
}

/** A set of glyphs read from a coverage table (or gathered): membership test. */
type GlyphSet = (gid: number) => boolean;

interface PairValue {
  first: QuickPosition;
  second: QuickPosition;
}

/** A ligature lookup: its subtables (coverage and ligatures in order), the glyphs it starts on and may continue with. */
interface LigatureLookup {
  subtables: Array<{ coverage: number; sets: Array<Array<{ glyph: number; components: number[] }>> }>;
  first: GlyphSet;
  next: GlyphSet;
}

class FontTables {
  private readonly v: DataView;
  /** Per lookup that can fire: the glyph sets that must each hold a glyph of the word. */
  readonly conditions: GlyphSet[][] = [];
  /** Ligature subtables as (glyphs a ligature starts with, glyphs that may follow them): fire only on such a pair. */
  readonly ligatures: LigatureLookup[] = [];
  /** Whether every pair lookup belongs to the kern feature alone (so that text set without kerning has none). */
  pairsOnlyKern = true;
  /** Pair adjustment subtables, by lookup in index order (offsets of the PairPos subtables). */
  readonly pairLookups: number[][] = [];
  private readonly glyphClass: ((gid: number) => number) | undefined;
  /** False when the font has something this reader does not handle: then every word goes to fontkit. */
  ok = true;
  /** Why not (for tests and debugging). */
  reason = '';

  fail(why: string): void {
    if (this.ok) this.reason = why;
    this.ok = false;
  }

  constructor(bytes: Uint8Array, directory: Record<string, { offset: number; length: number } | undefined>) {
    this.v = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    // fontkit kerns with an old-style kern table where GPOS has no kerning: not handled here.
    if (directory.kern) this.fail('a kern table');
    const gdef = directory.GDEF;
    if (gdef) {
      const classDefOffset = this.u16(gdef.offset + 4);
      if (classDefOffset) this.glyphClass = this.classDef(gdef.offset + classDefOffset);
    }
    for (const tag of ['GSUB', 'GPOS'] as const) {
      const t = directory[tag];
      if (t) this.readTable(tag, t.offset);
    }
  }

  private u16(at: number): number {
    return this.v.getUint16(at);
  }
  private i16(at: number): number {
    return this.v.getInt16(at);
  }

  isMark(gid: number): boolean {
    return this.glyphClass !== undefined && this.glyphClass(gid) === 3;
  }

  private readTable(tag: 'GSUB' | 'GPOS', base: number): void {
    if (this.u16(base) !== 1 || this.u16(base + 2) !== 0) {
      this.fail('a GSUB or GPOS table other than version 1.0'); // version 1.1 may carry feature variations
      return;
    }
    const scriptList = base + this.u16(base + 4);
    const featureList = base + this.u16(base + 6);
    const lookupList = base + this.u16(base + 8);
    // The lookups of the applied features, for each script fontkit may select.
    const perScript: number[][] = [];
    /** Lookups named by more than one feature (fontkit may then apply them more than once). */
    const twice = new Set<number>();
    /** Lookups named by a feature other than kern. */
    const notKern = new Set<number>();
    const scriptCount = this.u16(scriptList);
    for (let s = 0; s < scriptCount; s++) {
      const rec = scriptList + 2 + 6 * s;
      const scriptTag = this.tag(rec);
      if (!SCRIPTS.includes(scriptTag)) continue;
      const script = scriptList + this.u16(rec + 4);
      const langSysOffset = this.u16(script);
      const lookups = new Set<number>();
      const refs = new Map<number, number>();
      if (langSysOffset) {
        const langSys = script + langSysOffset;
        const n = this.u16(langSys + 4);
        for (let i = 0; i < n; i++) {
          const fi = this.u16(langSys + 6 + 2 * i);
          const frec = featureList + 2 + 6 * fi;
          const featureTag = this.tag(frec);
          if (!APPLIED.has(featureTag)) continue;
          const feature = featureList + this.u16(frec + 4);
          const count = this.u16(feature + 2);
          for (let k = 0; k < count; k++) {
            const li = this.u16(feature + 4 + 2 * k);
            lookups.add(li);
            refs.set(li, (refs.get(li) ?? 0) + 1);
            if (featureTag !== 'kern') notKern.add(li);
          }
        }
      }
      for (const [li, n] of refs) if (n > 1) twice.add(li);
      perScript.push([...lookups].sort((a, b) => a - b));
    }
    const all = [...new Set(perScript.flat())].sort((a, b) => a - b);
    const pairs: number[][] = [];
    const pairIndexes: number[] = [];
    for (const li of all) {
      const lookup = lookupList + this.u16(lookupList + 2 + 2 * li);
      const declared = this.u16(lookup);
      const flag = this.u16(lookup + 2);
      const n = this.u16(lookup + 4);
      const extension = tag === 'GSUB' ? 7 : 9;
      let type = declared;
      const subtables: number[] = [];
      for (let k = 0; k < n; k++) {
        let sub = lookup + this.u16(lookup + 6 + 2 * k);
        if (declared === extension) {
          const inner = this.u16(sub + 2);
          if (k > 0 && inner !== type) this.fail('an extension lookup of mixed types');
          type = inner;
          sub += this.v.getUint32(sub + 4);
        }
        subtables.push(sub);
      }
      if (tag === 'GPOS' && type === 2) {
        // Pair kerning, in lookups that skip at most marks (a quick word has none), so each glyph pairs with the next.
        if ((flag & 0x06) !== 0) this.fail('a pair lookup that skips base glyphs or ligatures');
        if (notKern.has(li)) this.pairsOnlyKern = false;
        pairs.push(subtables);
        pairIndexes.push(li);
        continue;
      }
      if (tag === 'GSUB' && type === 4 && (flag & 0x06) === 0 && !twice.has(li)) {
        // Ligatures skipping at most marks (a quick word has none): the components follow the first glyph directly,
        // so the lookup is applied here as fontkit applies it.
        const lig = this.ligatureLookup(subtables);
        if (lig) {
          this.ligatures.push(lig);
          continue;
        }
      }
      for (const sub of subtables) {
        const c = this.subtableConditions(tag, type, sub);
        if (c === undefined) this.fail('a lookup type not read here');
        else this.conditions.push(c);
      }
    }
    if (tag === 'GPOS') {
      // The pair lookups must be the same whichever of the scripts fontkit selects.
      const used = perScript.map((l) => l.filter((li) => pairIndexes.includes(li)).join(','));
      if (new Set(used).size > 1) this.fail('pair lookups that differ by script');
      this.pairLookups.push(...pairs);
    }
  }

  private tag(at: number): string {
    return String.fromCharCode(this.v.getUint8(at), this.v.getUint8(at + 1), this.v.getUint8(at + 2), this.v.getUint8(at + 3));
  }

  /** The glyph sets that must each hold a glyph of a word for this subtable to change it, or undefined if unknown. */
  private subtableConditions(tag: 'GSUB' | 'GPOS', type: number, sub: number): GlyphSet[] | undefined {
    const format = this.u16(sub);
    const cov = (rel: number): GlyphSet => this.coverage(sub + this.u16(sub + rel));
    const list = (at: number): GlyphSet[] => {
      const n = this.u16(at);
      const out: GlyphSet[] = [];
      for (let i = 0; i < n; i++) out.push(this.coverage(sub + this.u16(at + 2 + 2 * i)));
      return out;
    };
    const context = (): GlyphSet[] => {
      if (format === 1 || format === 2) return [cov(2)];
      if (format === 3) {
        const glyphCount = this.u16(sub + 2);
        const out: GlyphSet[] = [];
        for (let i = 0; i < glyphCount; i++) out.push(this.coverage(sub + this.u16(sub + 6 + 2 * i)));
        return out;
      }
      return [];
    };
    const chained = (): GlyphSet[] => {
      if (format === 1 || format === 2) return [cov(2)];
      if (format === 3) {
        const backtrack = sub + 2;
        const input = backtrack + 2 + 2 * this.u16(backtrack);
        const lookahead = input + 2 + 2 * this.u16(input);
        return [...list(backtrack), ...list(input), ...list(lookahead)];
      }
      return [];
    };
    if (tag === 'GSUB') {
      switch (type) {
        case 1:
        case 2:
        case 3:
          return [cov(2)];
        case 4:
          return this.ligatureConditions(sub);
        case 5:
          return context();
        case 6:
          return chained();
        case 8: {
          const backtrack = sub + 4;
          const lookahead = backtrack + 2 + 2 * this.u16(backtrack);
          return [cov(2), ...list(backtrack), ...list(lookahead)];
        }
        default:
          return undefined;
      }
    }
    switch (type) {
      case 1:
      case 3:
        return [cov(2)];
      case 4:
      case 5:
      case 6:
        return [cov(2), cov(4)];
      case 7:
        return context();
      case 8:
        return chained();
      default:
        return undefined;
    }
  }

  /** A ligature lookup read whole, or undefined if one of its ligatures has a single component. */
  private ligatureLookup(subtables: number[]): LigatureLookup | undefined {
    const out: LigatureLookup['subtables'] = [];
    const firsts: GlyphSet[] = [];
    const next = new Set<number>();
    for (const sub of subtables) {
      if (this.u16(sub) !== 1) return undefined;
      const coverage = sub + this.u16(sub + 2);
      firsts.push(this.coverage(coverage));
      const sets: LigatureLookup['subtables'][number]['sets'] = [];
      const setCount = this.u16(sub + 4);
      for (let s = 0; s < setCount; s++) {
        const set = sub + this.u16(sub + 6 + 2 * s);
        const ligs: Array<{ glyph: number; components: number[] }> = [];
        const n = this.u16(set);
        for (let i = 0; i < n; i++) {
          const lig = set + this.u16(set + 2 + 2 * i);
          const count = this.u16(lig + 2);
          if (count < 2) return undefined;
          const components: number[] = [];
          for (let k = 0; k < count - 1; k++) components.push(this.u16(lig + 4 + 2 * k));
          next.add(components[0]!);
          ligs.push({ glyph: this.u16(lig), components });
        }
        sets.push(ligs);
      }
      out.push({ coverage, sets });
    }
    return { subtables: out, first: (g) => firsts.some((f) => f(g)), next: (g) => next.has(g) };
  }

  /** A ligature subtable fires only on a covered glyph followed by a first component of one of its ligatures. */
  private ligatureConditions(sub: number): GlyphSet[] {
    const first = this.coverage(sub + this.u16(sub + 2));
    const setCount = this.u16(sub + 4);
    const next = new Set<number>();
    for (let s = 0; s < setCount; s++) {
      const set = sub + this.u16(sub + 6 + 2 * s);
      const n = this.u16(set);
      for (let i = 0; i < n; i++) {
        const lig = set + this.u16(set + 2 + 2 * i);
        const components = this.u16(lig + 2);
        if (components < 2) return [first];
        next.add(this.u16(lig + 4));
      }
    }
    return [first, (g) => next.has(g)];
  }

  private readonly coverageIndexes = new Map<number, number>();

  /** Index of a glyph in a coverage table, or -1 (as fontkit's coverageIndex). */
  coverageIndex(at: number, gid: number): number {
    const key = at * 65536 + gid;
    let index = this.coverageIndexes.get(key);
    if (index === undefined) {
      index = this.findInCoverage(at, gid);
      this.coverageIndexes.set(key, index);
    }
    return index;
  }

  private findInCoverage(at: number, gid: number): number {
    const format = this.u16(at);
    const n = this.u16(at + 2);
    if (format === 1) {
      let lo = 0;
      let hi = n - 1;
      while (lo <= hi) {
        const mid = (lo + hi) >> 1;
        const g = this.u16(at + 4 + 2 * mid);
        if (g === gid) return mid;
        if (g < gid) lo = mid + 1;
        else hi = mid - 1;
      }
      return -1;
    }
    if (format === 2) {
      // Ranges are searched in order, as fontkit does (the first range holding the glyph).
      for (let i = 0; i < n; i++) {
        const r = at + 4 + 6 * i;
        if (this.u16(r) <= gid && gid <= this.u16(r + 2)) return this.u16(r + 4) + gid - this.u16(r);
      }
      return -1;
    }
    this.fail('a coverage format not read here');
    return -1;
  }

  private coverage(at: number): GlyphSet {
    const format = this.u16(at);
    if (format === 1) {
      // fontkit finds a glyph with indexOf: the first entry equal to it. Coverage arrays are sorted; if one is not,
      // the binary search could miss a glyph, so an unsorted array makes the font unsupported.
      const n = this.u16(at + 2);
      for (let i = 1; i < n; i++) if (this.u16(at + 4 + 2 * i) <= this.u16(at + 2 + 2 * i)) this.fail('an unsorted coverage table');
    } else if (format !== 2) this.fail('a coverage format not read here');
    return (gid) => this.coverageIndex(at, gid) >= 0;
  }

  /** The class of a glyph in a class definition table (0 when not listed), as fontkit's getClassID. */
  classDef(at: number): (gid: number) => number {
    const format = this.u16(at);
    if (format === 1) {
      const start = this.u16(at + 2);
      const n = this.u16(at + 4);
      return (gid) => {
        const i = gid - start;
        return i >= 0 && i < n ? this.u16(at + 6 + 2 * i) : 0;
      };
    }
    if (format === 2) {
      const n = this.u16(at + 2);
      return (gid) => {
        for (let i = 0; i < n; i++) {
          const r = at + 4 + 6 * i;
          if (this.u16(r) <= gid && gid <= this.u16(r + 2)) return this.u16(r + 4);
        }
        return 0;
      };
    }
    this.fail('a class definition format not read here');
    return () => 0;
  }

  private valueRecord(at: number, format: number): QuickPosition {
    const p: QuickPosition = { xAdvance: 0, yAdvance: 0, xOffset: 0, yOffset: 0 };
    let o = at;
    if (format & 0x1) {
      p.xOffset = this.i16(o);
      o += 2;
    }
    if (format & 0x2) {
      p.yOffset = this.i16(o);
      o += 2;
    }
    if (format & 0x4) {
      p.xAdvance = this.i16(o);
      o += 2;
    }
    if (format & 0x8) p.yAdvance = this.i16(o);
    return p;
  }

  private static recordSize(format: number): number {
    let n = 0;
    for (let f = format & 0xff; f; f >>= 1) n += f & 1;
    return 2 * n;
  }

  private readonly classDefs = new Map<number, (gid: number) => number>();

  /** The adjustment a pair lookup's subtables give the pair (a, b), or undefined when none covers it. */
  pairInLookup(subtables: number[], a: number, b: number): PairValue | undefined {
    for (const sub of subtables) {
      const format = this.u16(sub);
      const index = this.coverageIndex(sub + this.u16(sub + 2), a);
      if (index === -1) continue;
      const f1 = this.u16(sub + 4);
      const f2 = this.u16(sub + 6);
      const s1 = FontTables.recordSize(f1);
      const s2 = FontTables.recordSize(f2);
      if (format === 1) {
        const set = sub + this.u16(sub + 10 + 2 * index);
        const n = this.u16(set);
        for (let i = 0; i < n; i++) {
          const rec = set + 2 + i * (2 + s1 + s2);
          if (this.u16(rec) === b) return { first: this.valueRecord(rec + 2, f1), second: this.valueRecord(rec + 2 + s1, f2) };
        }
        continue;
      }
      if (format === 2) {
        const cd1 = sub + this.u16(sub + 8);
        const cd2 = sub + this.u16(sub + 10);
        const c1 = this.cachedClassDef(cd1)(a);
        const c2 = this.cachedClassDef(cd2)(b);
        const class1Count = this.u16(sub + 12);
        const class2Count = this.u16(sub + 14);
        if (c1 >= class1Count || c2 >= class2Count) {
          this.fail('a class out of range');
          return undefined;
        }
        const rec = sub + 16 + (c1 * class2Count + c2) * (s1 + s2);
        return { first: this.valueRecord(rec, f1), second: this.valueRecord(rec + s1, f2) };
      }
      this.fail('a pair adjustment format not read here');
      return undefined;
    }
    return undefined;
  }

  private cachedClassDef(at: number): (gid: number) => number {
    let c = this.classDefs.get(at);
    if (c === undefined) {
      c = this.classDef(at);
      this.classDefs.set(at, c);
    }
    return c;
  }
}

/** What is known of one glyph: its fontkit object, whether it may go in a quick word, the conditions it meets. */
interface GlyphInfo {
  glyph: fontkit.Glyph;
  /** Indexes of the conditions (flattened over lookups) whose glyph set holds this glyph. */
  meets: number[];
  /** Indexes of the ligature subtables that may start with this glyph, and of those it may follow into. */
  starts: number[];
  follows: number[];
}

/** The quick shaper of one font. */
export class QuickShaper {
  private readonly tables: FontTables;
  private readonly byCodePoint = new Map<number, GlyphInfo | null>();
  private readonly pairs = new Map<number, PairValue | null>();
  /** The glyph sets of all conditions, flattened, and for each lookup subtable the indexes of its own. */
  private readonly sets: GlyphSet[] = [];
  private readonly lookupConditions: number[][] = [];
  private readonly seen: Uint8Array;

  constructor(
    private readonly font: fontkit.Font,
    bytes: Uint8Array,
  ) {
    const directory = (font as unknown as { directory: { tables: Record<string, { offset: number; length: number }> } }).directory.tables;
    this.tables = new FontTables(bytes, directory);
    this.tables.conditions.forEach((conds) => {
      const ids: number[] = [];
      for (const set of conds) {
        ids.push(this.sets.length);
        this.sets.push(set);
      }
      this.lookupConditions.push(ids);
    });
    this.seen = new Uint8Array(this.sets.length);
  }

  get supported(): boolean {
    return this.tables.ok;
  }

  /** Why the font is not supported ('' when it is). */
  get reason(): string {
    return this.tables.reason;
  }

  private info(cp: number): GlyphInfo | null {
    let info = this.byCodePoint.get(cp);
    if (info !== undefined) return info;
    info = null;
    if (plainChar(cp) && this.font.hasGlyphForCodePoint(cp)) {
      const glyph = this.font.glyphForCodePoint(cp);
      if (glyph.id !== 0) info = this.glyphInfo(glyph);
    }
    this.byCodePoint.set(cp, info);
    return info;
  }

  private readonly byGlyph = new Map<fontkit.Glyph, GlyphInfo | null>();

  /** What is known of a glyph, or null for a mark (never in a quick word). */
  private glyphInfo(glyph: fontkit.Glyph): GlyphInfo | null {
    let info = this.byGlyph.get(glyph);
    if (info !== undefined) return info;
    info = null;
    if (!this.tables.isMark(glyph.id)) {
      const meets: number[] = [];
      this.sets.forEach((set, i) => {
        if (set(glyph.id)) meets.push(i);
      });
      const starts: number[] = [];
      const follows: number[] = [];
      this.tables.ligatures.forEach((l, i) => {
        if (l.first(glyph.id)) starts.push(i);
        if (l.next(glyph.id)) follows.push(i);
      });
      info = { glyph, meets, starts, follows };
    }
    this.byGlyph.set(glyph, info);
    return info;
  }

  /** The ligature lookup that could act on the pair (a, b): -1 for none, -2 for more than one. */
  private static ligatureOn(a: GlyphInfo, b: GlyphInfo): number {
    if (a.starts.length === 0 || b.follows.length === 0) return -1;
    let found = -1;
    for (const l of a.starts) {
      if (!b.follows.includes(l)) continue;
      if (found !== -1 && found !== l) return -2;
      found = l;
    }
    return found;
  }

  /**
   * Apply one ligature lookup as fontkit does: glyph by glyph from the start, each subtable in turn until one forms a
   * ligature at the glyph (its ligatures tried in order, components matched against the glyphs that follow); the
   * ligature glyph carries the code points of the glyphs it replaces. Undefined when the result holds a mark.
   */
  private ligate(l: number, infos: GlyphInfo[]): GlyphInfo[] | undefined {
    const lookup = this.tables.ligatures[l]!;
    const out: GlyphInfo[] = [];
    let i = 0;
    while (i < infos.length) {
      const cur = infos[i]!;
      let formed: GlyphInfo | null | undefined;
      let length = 0;
      for (const sub of lookup.subtables) {
        const index = this.tables.coverageIndex(sub.coverage, cur.glyph.id);
        if (index === -1) continue;
        const lig = sub.sets[index]?.find((c) => c.components.every((g, k) => infos[i + 1 + k]?.glyph.id === g));
        if (!lig) continue;
        const codePoints = [...cur.glyph.codePoints];
        for (let k = 1; k <= lig.components.length; k++) codePoints.push(...infos[i + k]!.glyph.codePoints);
        formed = this.glyphInfo(this.font.getGlyph(lig.glyph, codePoints));
        length = 1 + lig.components.length;
        break;
      }
      if (formed === null) return undefined;
      if (formed === undefined) {
        out.push(cur);
        i++;
      } else {
        out.push(formed);
        i += length;
      }
    }
    return out;
  }

  private pair(a: number, b: number): PairValue | null {
    const key = a * 65536 + b;
    let v = this.pairs.get(key);
    if (v !== undefined) return v;
    const total: PairValue = { first: { xAdvance: 0, yAdvance: 0, xOffset: 0, yOffset: 0 }, second: { xAdvance: 0, yAdvance: 0, xOffset: 0, yOffset: 0 } };
    let any = false;
    for (const subtables of this.tables.pairLookups) {
      const p = this.tables.pairInLookup(subtables, a, b);
      if (!p) continue;
      any = true;
      for (const k of ['xAdvance', 'yAdvance', 'xOffset', 'yOffset'] as const) {
        total.first[k] += p.first[k];
        total.second[k] += p.second[k];
      }
    }
    v = any ? total : null;
    this.pairs.set(key, v);
    return v;
  }

  /** Whether some lookup other than pair kerning and the ligatures finds a glyph of the word in each of its sets. */
  private anyFires(infos: GlyphInfo[]): boolean {
    const seen = this.seen;
    let hits = false;
    for (const info of infos) {
      for (const c of info.meets) {
        seen[c] = 1;
        hits = true;
      }
    }
    if (!hits) return false;
    let fires = false;
    for (const ids of this.lookupConditions) {
      if (ids.length > 0 && ids.every((c) => seen[c] === 1)) {
        fires = true;
        break;
      }
    }
    seen.fill(0);
    return fires;
  }

  /**
   * The glyphs and positions (font units) fontkit's layout gives `text`, or undefined when fontkit must shape it.
   * With `kern` false, as fontkit's layout with the features { kern: false }: no pair kerning.
   */
  layout(text: string, kern = true): QuickRun | undefined {
    if (!this.tables.ok || text.length === 0) return undefined;
    if (!kern && !this.tables.pairsOnlyKern) return undefined;
    let infos: GlyphInfo[] = [];
    let ligature = -1;
    for (let i = 0; i < text.length; i++) {
      const info = this.info(text.charCodeAt(i));
      if (info === null) return undefined;
      const before = infos[i - 1];
      if (before !== undefined) {
        const l = QuickShaper.ligatureOn(before, info);
        if (l === -2 || (l >= 0 && ligature >= 0 && l !== ligature)) return undefined;
        if (l >= 0) ligature = l;
      }
      infos.push(info);
    }
    if (ligature >= 0) {
      const formed = this.ligate(ligature, infos);
      if (formed === undefined) return undefined;
      // No other ligature may form on the result.
      for (let i = 1; i < formed.length; i++) {
        const l = QuickShaper.ligatureOn(formed[i - 1]!, formed[i]!);
        if (l !== -1 && l !== ligature) return undefined;
      }
      // Lookups before the ligatures see the glyphs before, those after see the glyphs after: check both.
      if (this.anyFires(infos)) return undefined;
      infos = formed;
    }
    if (this.anyFires(infos) || !this.tables.ok) return undefined;
    const glyphs = infos.map((info) => info.glyph);
    const positions: QuickPosition[] = glyphs.map((g) => ({ xAdvance: g.advanceWidth, yAdvance: 0, xOffset: 0, yOffset: 0 }));
    for (let i = 0; kern && i + 1 < glyphs.length; i++) {
      const p = this.pair(glyphs[i]!.id, glyphs[i + 1]!.id);
      if (p === null) continue;
      const a = positions[i]!;
      const b = positions[i + 1]!;
      a.xAdvance += p.first.xAdvance;
      a.yAdvance += p.first.yAdvance;
      a.xOffset += p.first.xOffset;
      a.yOffset += p.first.yOffset;
      b.xAdvance += p.second.xAdvance;
      b.yAdvance += p.second.yAdvance;
      b.xOffset += p.second.xOffset;
      b.yOffset += p.second.yOffset;
    }
    if (!this.tables.ok) return undefined;
    return { glyphs, positions };
  }
}
