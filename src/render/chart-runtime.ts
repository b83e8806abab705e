/**
 * The chart runtime: Vega-Lite spec -> Vega runtime spec -> headless Vega view -> SVG string. The spec builders
 * live in charts.ts; this module only turns a spec into a drawing, as fast as it can while giving the very same
 * drawing as compiling and parsing each spec from scratch.
 *
 * Compiling a Vega-Lite spec and parsing the Vega spec it gives take most of a chart's time, yet the charts of a pack
 * share a few shapes: the same layers and encodings, differing only in their data, labels, axis domains and heights.
 * So each shape is compiled and parsed once, with stand-in values (sentinels) in the places that vary; the runtime
 * spec of a chart is then that shape's runtime spec with the stand-ins replaced by the chart's own values.
 *
 * A shape is used this way only when it is proven to behave: when first met, it is compiled with two different sets
 * of stand-ins (the second full of quotes, backslashes, line breaks and negative numbers), how each stand-in must be
 * written at each place where it lands (as it is, or escaped inside expression code) is learnt from the two, and the
 * second set, written into the first compile, must give exactly what compiling the second gave; and the template,
 * written with the values of the shape's first chart, must give exactly that chart's own compile. A shape is learnt
 * when it is met a second time (that chart is then drawn from the template), so that a shape drawn once costs one
 * compile as before; the chart thread's warm-up learns its shape at once. A shape that fails is compiled and parsed
 * anew for every chart, as before.
 */
import { isDeepStrictEqual } from 'node:util';
import { faceFor, textWidth } from './fonts.js';
import { KeptUntilUsed } from './kept.js';
import { recordScene, type ChartDrawing } from './chart-pdf.js';

type VegaModule = typeof import('vega');
type VegaLiteModule = typeof import('vega-lite');

interface VegaTextItem {
  fontSize?: number;
  fontWeight?: string | number;
  fontStyle?: string;
}

/** Text widths remembered before the table is emptied. */
const WIDTHS_KEPT = 20_000;

let libs: Promise<{ vega: VegaModule; vl: VegaLiteModule }> | undefined;

/** Load vega and vega-lite on first use (each costs a few tenths of a second to import). */
export async function loadChartLibs(): Promise<{ vega: VegaModule; vl: VegaLiteModule }> {
  libs ??= Promise.all([import('vega'), import('vega-lite')]).then(([vega, vl]) => {
    // Vega without a canvas guesses 0.8 em per character; measure with the embedded faces instead.
    const metrics = (vega as unknown as { textMetrics: { width: (item: VegaTextItem, text: unknown) => number } }).textMetrics;
    // Widths are asked for again and again (each label at each layout pass, in each chart): remember them.
    const widths = new Map<string, number>();
    metrics.width = (item: VegaTextItem, text: unknown): number => {
      const s = text == null ? '' : String(text).trim();
      const size = item.fontSize ?? 11;
      const face = faceFor(item.fontWeight, item.fontStyle);
      const key = `${String(face)}\u0000${size}\u0000${s}`;
      let w = widths.get(key);
      if (w === undefined) {
        w = textWidth(s, size, face);
        if (widths.size >= WIDTHS_KEPT) widths.clear();
        widths.set(key, w);
      }
      return w;
    };
    return { vega, vl };
  });
  return libs;
}

/** Compile a Vega-Lite spec to a Vega spec, collecting every Vega-Lite warning (a correct spec compiles with none). */
export async function compileVegaLite(spec: object): Promise<{ vegaSpec: object; warnings: string[] }> {
  const { vl } = await loadChartLibs();
  return compileWith(vl, spec);
}

function compileWith(vl: VegaLiteModule, spec: object): { vegaSpec: object; warnings: string[] } {
  const warnings: string[] = [];
  const logger: Record<string, (...args: unknown[]) => unknown> = {
    level() {
      return logger;
    },
    warn(...args: unknown[]) {
      warnings.push(args.map(String).join(' '));
      return logger;
    },
    info() {
      return logger;
    },
    debug() {
      return logger;
    },
    error(...args: unknown[]) {
      throw new Error(`Vega-Lite error: ${args.map(String).join(' ')}`);
    },
  };
  const result = vl.compile(spec as Parameters<VegaLiteModule['compile']>[0], {
    logger: logger as unknown as NonNullable<Parameters<VegaLiteModule['compile']>[1]>['logger'],
  });
  return { vegaSpec: result.spec, warnings };
}

// ---------------------------------------------------------------------------------------------------------------
// Shapes and stand-ins

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

/**
 * Where a value varies from chart to chart without changing how the spec compiles: every field of inline data rows,
 * the items of an explicit sort order or scale domain, titles and subtitles, the outer height and an axis's tick
 * count. Every other value (mark types, encodings, formats, label angles, colours, alignments) is part of the shape.
 */
const SLOT_KEYS = new Set(['title', 'text', 'subtitle', 'height', 'tickCount', 'description']);
const SLOT_ARRAYS = new Set(['sort', 'domain']);

/** A place that varies: the value there, in the order met while walking the spec. */
export type Slot = string | number;

/** A slot-holding leaf: non-empty strings and finite non-zero numbers (empty strings and zeros can change a compile). */
function slotValue(v: unknown): v is Slot {
  return (typeof v === 'string' && v.length > 0) || (typeof v === 'number' && Number.isFinite(v) && v !== 0);
}

/**
 * A copy of a Vega-Lite spec with each slot-holding leaf replaced by `f(leaf)`, leaves met in a fixed order: every leaf
 * of the rows under a `data.values`, leaves under a SLOT_KEYS key (alone or in an array), items of a SLOT_ARRAYS array.
 */
function mapSlots(spec: Json, f: (leaf: Slot) => Json): Json {
  const walk = (v: Json, slotted: boolean, isData: boolean): Json => {
    if (Array.isArray(v)) return v.map((x) => walk(x, slotted, false));
    if (v !== null && typeof v === 'object') {
      const out: Record<string, Json> = {};
      for (const [k, x] of Object.entries(v)) {
        const leafy = x === null || typeof x !== 'object' || (Array.isArray(x) && x.every((i) => i === null || typeof i !== 'object'));
        const here = slotted || (isData && k === 'values') || (leafy && (SLOT_KEYS.has(k) || (SLOT_ARRAYS.has(k) && Array.isArray(x))));
        out[k] = walk(x, here, k === 'data');
      }
      return out;
    }
    return slotted && slotValue(v) ? f(v) : v;
  };
  return walk(spec, false, false);
}

/**
 * Split a Vega-Lite spec into its shape (a string key) and its slot values. Equal values share a slot, because the
 * compiler merges equal parts (the same sort order in every layer becomes one transform), so which places hold equal
 * values is part of the shape.
 */
function splitSpec(spec: Json): { key: string; slots: Slot[] } {
  const slots: Slot[] = [];
  const index = new Map<Slot, number>();
  const skeleton = mapSlots(spec, (v) => {
    let i = index.get(v);
    if (i === undefined) {
      i = slots.length;
      slots.push(v);
      index.set(v, i);
    }
    return { $slot: i };
  });
  return { key: JSON.stringify(skeleton), slots };
}

/** The spec with each slot's value replaced by the same slot's value in `values`. */
function fillSpec(spec: Json, slots: Slot[], values: Slot[]): Json {
  const index = new Map<Slot, number>(slots.map((v, i) => [v, i]));
  return mapSlots(spec, (v) => values[index.get(v) as number] as Slot);
}

/** First stand-ins: plain tokens and numbers unlikely to occur by chance, increasing so that domains stay ordered. */
function plainStandIns(slots: Slot[]): Slot[] {
  return slots.map((s, i) => (typeof s === 'string' ? `\u2063s${i}\u2063` : 7341.59265 + i * 1.000123));
}
/** Second stand-ins: strings that need escaping in expression code, and negative numbers. */
function hostileStandIns(slots: Slot[]): Slot[] {
  return slots.map((s, i) => (typeof s === 'string' ? `"q'\\\né<&>${i}` : -9123.456789 + i * 1.000321));
}

/**
 * How a stand-in written inside a string must be replaced: as it is, escaped as JSON writes a string (Vega-Lite's
 * string literals in expressions), or with only its double quotes escaped (Vega-Lite's tooltip and description keys).
 */
export type Writing = 'raw' | 'js' | 'dq';
const WRITINGS: Writing[] = ['raw', 'js', 'dq'];
const escapeJs = (s: string): string => JSON.stringify(s).slice(1, -1).replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');

/** A string of the template: the pieces between stand-ins, the slot of each stand-in and its writing. */
export interface StringPart {
  pieces: string[];
  slots: number[];
  writing: Writing;
}

/** The compiled shape: a runtime spec in which leaves are replaced by their slot's value. */
export type Template = { kind: 'value'; slot: number } | { kind: 'string'; part: StringPart } | { kind: 'array'; items: Template[] } | { kind: 'object'; entries: Array<[string, Template]> } | { kind: 'const'; value: unknown };

class NotTemplatable extends Error {}

/** Text of a stand-in as it appears inside a string. */
const standInText = (s: Slot): string => String(s);

/**
 * Learn the template from the runtime spec compiled with the plain stand-ins (a) and with the hostile ones (b).
 * Throws NotTemplatable where the two differ other than by the stand-ins.
 */
function learn(a: unknown, b: unknown, plain: Slot[], hostile: Slot[]): Template {
  const byValue = new Map<Slot, number>(plain.map((s, i) => [s, i]));
  const tokens = plain.map(standInText);
  const find = (s: string): { pieces: string[]; slots: number[] } | undefined => {
    const pieces: string[] = [];
    const slots: number[] = [];
    let at = 0;
    let from = 0;
    for (;;) {
      let best = -1;
      let bestSlot = -1;
      for (let i = 0; i < tokens.length; i++) {
        const p = s.indexOf(tokens[i] as string, at);
        if (p >= 0 && (best < 0 || p < best || (p === best && (tokens[i] as string).length > (tokens[bestSlot] as string).length))) {
          best = p;
          bestSlot = i;
        }
      }
      if (best < 0) break;
      pieces.push(s.slice(from, best));
      slots.push(bestSlot);
      at = best + (tokens[bestSlot] as string).length;
      from = at;
    }
    if (slots.length === 0) return undefined;
    pieces.push(s.slice(from));
    return { pieces, slots };
  };
  const walk = (x: unknown, y: unknown, path: string): Template => {
    const differ = (): never => {
      throw new NotTemplatable(`${path}: ${JSON.stringify(x)?.slice(0, 200)} against ${JSON.stringify(y)?.slice(0, 200)}`);
    };
    if (typeof x === 'number' && byValue.has(x)) {
      const slot = byValue.get(x) as number;
      if (y !== hostile[slot]) return differ();
      return { kind: 'value', slot };
    }
    if (typeof x === 'string') {
      if (byValue.has(x) && y === hostile[byValue.get(x) as number]) return { kind: 'value', slot: byValue.get(x) as number };
      const found = find(x);
      if (found) {
        for (const writing of WRITINGS) {
          const part = { ...found, writing };
          if (writeString(part, hostile) === y) return { kind: 'string', part };
        }
        return differ();
      }
    }
    if (Array.isArray(x)) {
      if (!Array.isArray(y) || y.length !== x.length) return differ();
      return { kind: 'array', items: x.map((v, i) => walk(v, y[i], `${path}[${i}]`)) };
    }
    if (x !== null && typeof x === 'object') {
      if (y === null || typeof y !== 'object' || Array.isArray(y)) return differ();
      const keys = Object.keys(x);
      if (!isDeepStrictEqual(keys, Object.keys(y))) return differ();
      return { kind: 'object', entries: keys.map((k) => [k, walk((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], `${path}.${k}`)]) };
    }
    if (!Object.is(x, y)) return differ();
    return { kind: 'const', value: x };
  };
  return walk(a, b, '');
}

function writeString(part: StringPart, values: Slot[]): string {
  let s = part.pieces[0] as string;
  for (let i = 0; i < part.slots.length; i++) {
    const v = standInText(values[part.slots[i] as number] as Slot);
    s += (part.writing === 'js' ? escapeJs(v) : part.writing === 'dq' ? v.replace(/"/g, '\\"') : v) + (part.pieces[i + 1] as string);
  }
  return s;
}

/**
 * The runtime spec of a chart: the template with its slots filled, read walking the template. Fresh objects every
 * time (a view may change them). The charts are drawn from the template compiled into a function
 * (compileTemplate), which must give the very same spec; this walk is its reference.
 */
export function instantiate(t: Template, values: Slot[]): unknown {
  switch (t.kind) {
    case 'value':
      return values[t.slot];
    case 'string':
      return writeString(t.part, values);
    case 'array':
      return t.items.map((x) => instantiate(x, values));
    case 'object': {
      const out: Record<string, unknown> = {};
      for (const [k, x] of t.entries) {
        // An own property, as JSON.parse makes it (assigning "__proto__" would set the prototype instead).
        if (k === '__proto__') Object.defineProperty(out, k, { value: instantiate(x, values), enumerable: true, writable: true, configurable: true });
        else out[k] = instantiate(x, values);
      }
      return out;
    }
    default:
      return t.value;
  }
}

/** Fills a template's slots: the runtime spec of a chart of its shape, as fresh objects. */
export type Filler = (values: Slot[]) => unknown;

const escapeDq = (s: string): string => s.replace(/"/g, '\\"');

/**
 * A template compiled into one function that builds the runtime spec as object and array literals, with the slots
 * read from its argument: the engine makes each chart's spec by copying the literals' constant parts, in objects of
 * stable shapes, instead of walking the template entry by entry. Gives the same spec as instantiate (tested on
 * hostile values); values that are not JSON primitives are handed over as they are, as instantiate does.
 */
export function compileTemplate(t: Template): Filler {
  const consts: unknown[] = [];
  const literal = (x: unknown): string => {
    if (x === null || typeof x === 'boolean' || typeof x === 'string') return JSON.stringify(x);
    if (typeof x === 'number' && Number.isFinite(x) && !Object.is(x, -0)) return JSON.stringify(x);
    consts.push(x);
    return `c[${consts.length - 1}]`;
  };
  const slotText = (slot: number, writing: Writing): string =>
    writing === 'js' ? `e(String(v[${slot}]))` : writing === 'dq' ? `d(String(v[${slot}]))` : `String(v[${slot}])`;
  const emit = (x: Template): string => {
    switch (x.kind) {
      case 'value':
        return `v[${x.slot}]`;
      case 'string': {
        const { pieces, slots, writing } = x.part;
        let code = `(${JSON.stringify(pieces[0])}`;
        for (let i = 0; i < slots.length; i++) code += `+${slotText(slots[i] as number, writing)}+${JSON.stringify(pieces[i + 1])}`;
        return `${code})`;
      }
      case 'array':
        return `[${x.items.map(emit).join(',')}]`;
      case 'object':
        // A computed "__proto__" key makes an own property, as JSON.parse does; a plain one would set the prototype.
        return `{${x.entries.map(([k, y]) => `${k === '__proto__' ? '["__proto__"]' : JSON.stringify(k)}:${emit(y)}`).join(',')}}`;
      default:
        return literal(x.value);
    }
  };
  const body = emit(t);
  const make = new Function('e', 'd', 'c', `'use strict';return function fill(v){return ${body};};`) as (
    e: (s: string) => string,
    d: (s: string) => string,
    c: unknown[],
  ) => Filler;
  return make(escapeJs, escapeDq, consts);
}

/** A runtime spec as plain JSON values (vega.parse gives class instances that serialise to plain objects). */
const plainJson = (x: unknown): unknown => JSON.parse(JSON.stringify(x)) as unknown;

/** Shapes met so far: their compiled template, null for a shape compiled chart by chart, 'seen' for a shape met once. */
const SHAPES_KEPT = 256;
const shapes = new Map<string, Filler | null | 'seen'>();

/**
 * The runtime spec of the first chart of each shape met once, as plain JSON, with that chart's slot values: the
 * template learnt when the shape is met again is proven against it, so the second chart needs no compile of its own.
 * Only the latest few are kept (a runtime spec is some 50 KB); a shape met again after its first was let go is
 * proven against its own compile instead.
 */
const FIRSTS_KEPT = 16;
const firsts = new Map<string, { slots: Slot[]; runtime: unknown }>();

/**
 * Learn a shape's template from the spec of one of its charts (two compiles, with the plain and the hostile
 * stand-ins) and prove it: written with `proof`'s slot values, it must give `proof`'s runtime spec exactly.
 * Null when the shape cannot be templated.
 */
function learnShape(parse: (s: object) => object, spec: Json, slots: Slot[], proof: { slots: Slot[]; runtime: unknown }): Filler | null {
  try {
    const plain = plainStandIns(slots);
    const hostile = hostileStandIns(slots);
    const a = plainJson(parse(fillSpec(spec, slots, plain) as object));
    const b = plainJson(parse(fillSpec(spec, slots, hostile) as object));
    const learnt = compileTemplate(learn(a, b, plain, hostile));
    const mine = learnt(proof.slots);
    if (isDeepStrictEqual(mine, proof.runtime)) return learnt;
    if (process.env.WARRANT_DEBUG_CHARTS) console.error('chart shape not templated:', firstDifference(mine, proof.runtime, ''));
  } catch (e) {
    // A stand-in the compiler cannot take (or a shape that differs by more than its stand-ins): no template.
    if (process.env.WARRANT_DEBUG_CHARTS) console.error('chart shape not templated:', e);
  }
  return null;
}

function keepShape(key: string, known: Filler | null | 'seen' | undefined, template: Filler | null | 'seen'): void {
  if (known === undefined && shapes.size >= SHAPES_KEPT) shapes.delete(shapes.keys().next().value as string);
  shapes.set(key, template);
}

/**
 * The runtime spec of a chart. `learnNow`: learn the chart's shape at once rather than when it is met a second time
 * (the chart thread's warm-up charts, whose shape the pack's charts will have).
 */
async function runtimeSpecOf(spec: object, learnNow = false): Promise<object> {
  const { vega, vl } = await loadChartLibs();
  const parse = (s: object): object => {
    const { vegaSpec, warnings } = compileWith(vl, s);
    if (warnings.length > 0) throw new Error(`Chart spec has Vega-Lite warnings: ${warnings.join('; ')}`);
    return vega.parse(vegaSpec as Parameters<VegaModule['parse']>[0]) as unknown as object;
  };
  const { key, slots } = splitSpec(spec as Json);
  const known = shapes.get(key);
  if (known !== undefined && known !== 'seen') return known === null ? parse(spec) : (known(slots) as object);
  const first = known === 'seen' ? firsts.get(key) : undefined;
  if (first) {
    // The shape met again: learnt, proven against its first chart, and this chart drawn from the template.
    firsts.delete(key);
    const template = learnShape(parse, spec as Json, slots, first);
    keepShape(key, known, template);
    return template ? (template(slots) as object) : parse(spec);
  }
  // The first chart of a shape is compiled as it is (which also reports its warnings); the shape is learnt when it is
  // met again, so that a shape drawn once costs no more than before.
  const own = parse(spec);
  if (known === 'seen' || learnNow) {
    keepShape(key, known, learnShape(parse, spec as Json, slots, { slots, runtime: plainJson(own) }));
  } else {
    if (firsts.size >= FIRSTS_KEPT) firsts.delete(firsts.keys().next().value as string);
    firsts.set(key, { slots, runtime: plainJson(own) });
    keepShape(key, known, 'seen');
  }
  return own;
}

/**
 * Drawings of the charts drawn lately, by their SVG: the PDF draws a chart from its scene rather than its SVG. A
 * drawing not yet used by a page is never forgotten (the chart thread draws ahead of the pages).
 */
const DRAWINGS_KEPT = 512;
const drawings = new KeptUntilUsed<ChartDrawing>(DRAWINGS_KEPT);

/** The chart drawn as this SVG, as paint operations for the PDF (undefined when it must be drawn from the SVG). */
export function chartDrawing(svg: string): ChartDrawing | undefined {
  return drawings.get(svg);
}

/** Remember the paint operations of the chart drawn as this SVG (drawn here, or on the chart thread). */
export function keepDrawing(svg: string, drawing: ChartDrawing | undefined): void {
  if (!drawing || drawings.has(svg)) return;
  drawings.set(svg, drawing, false);
}

/**
 * Draw a Vega-Lite spec headless (no canvas): its SVG string, and the same scene recorded as paint operations for the
 * PDF (undefined when the scene holds something the recorder does not draw). Plain data both, so the chart thread
 * can hand them to the main thread as they are. `learnShape`: learn the spec's shape now rather than when it is met
 * again (for charts drawn ahead of the pack's own, of the same shape).
 */
export async function drawSpec(spec: object, options: { learnShape?: boolean } = {}): Promise<{ svg: string; drawing: ChartDrawing | undefined }> {
  const { vega } = await loadChartLibs();
  const runtime = await runtimeSpecOf(spec, options.learnShape === true);
  const view = new vega.View(runtime as ReturnType<VegaModule['parse']>, { renderer: 'none' });
  try {
    const svg = await view.toSVG();
    const root = /<svg\b[^>]*>/.exec(svg)?.[0] ?? '';
    const width = Number(/\swidth="([\d.]+)"/.exec(root)?.[1]);
    const height = Number(/\sheight="([\d.]+)"/.exec(root)?.[1]);
    const padding = view.padding() as { left: number; top: number };
    const origin = view.origin();
    const drawing =
      width > 0 && height > 0
        ? recordScene(
            (vega as unknown as { Marks: Parameters<typeof recordScene>[0] }).Marks,
            (view.scenegraph() as unknown as { root: unknown }).root as Parameters<typeof recordScene>[1],
            { width, height, origin: [padding.left + origin[0], padding.top + origin[1]], background: view.background() as string | null },
          )
        : undefined;
    return { svg, drawing };
  } finally {
    view.finalize();
  }
}

/**
 * Draw a Vega-Lite spec headless (no canvas) as an SVG string, and record the same scene as paint operations for the
 * PDF (chartDrawing).
 */
export async function specSvg(spec: object): Promise<string> {
  const { svg, drawing } = await drawSpec(spec);
  keepDrawing(svg, drawing);
  return svg;
}

function firstDifference(a: unknown, b: unknown, path: string): string | undefined {
  if (isDeepStrictEqual(a, b)) return undefined;
  if (a && b && typeof a === 'object' && typeof b === 'object') {
    for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) {
      const d = firstDifference((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`);
      if (d) return d;
    }
  }
  return `${path}: ${JSON.stringify(a)?.slice(0, 300)} against ${JSON.stringify(b)?.slice(0, 300)}`;
}

/** For tests: how many shapes are known, and how many of them are drawn from a template. */
export function shapeStats(): { shapes: number; templated: number } {
  return { shapes: shapes.size, templated: [...shapes.values()].filter((t) => t !== null && t !== 'seen').length };
}
