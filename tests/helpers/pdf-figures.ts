/**
 * Reads the numbers table of every claim in a pack from poppler's `pdftotext -layout` output (a tool outside the
 * project) and looks each printed figure up in results.json at the precision it was printed with.
 *
 * The table is parsed as labelled rows, not at fixed positions: a table's columns are found from where its own
 * cells start (runs of two or more spaces separate cells), so wider or narrower columns, a second label/value pair
 * on a line, wrapped labels and wrapped values all parse the same. Rows start where a label cell and a value cell
 * share a line; a label cell alone continues the label above it, a value cell alone continues the value.
 */

export interface TableRow {
  claim: string;
  label: string;
  value: string;
}

export interface Figure {
  claim: string;
  /** The row's label, for messages. */
  label: string;
  /** The figure as printed, e.g. "−11.9", "72.2%", "2,052", "< 0.001". */
  text: string;
  /** Scales the printed number may be on relative to results.json: 1 (as stored), 100 (a proportion as % or points). */
  scales: number[];
  found: boolean;
}

/** Lines of each claim's numbers table, keyed by claim id (lower case as in results.json). */
export function numbersTables(layoutText: string): Map<string, string[]> {
  const pages = layoutText.split('\f');
  // Page furniture: the running header (first non-blank line of a page) and the footer ("... Page N of M").
  const body: string[] = [];
  for (const page of pages) {
    const lines = page.split('\n');
    const first = lines.findIndex((l) => l.trim() !== '');
    lines.forEach((l, i) => {
      if (i === first && !/^CLAIM /.test(l.trim()) && !/^EVIDENCE PACK/.test(l.trim())) return;
      if (/Page \d+ of \d+\s*$/.test(l)) return;
      body.push(l);
    });
  }
  const tables = new Map<string, string[]>();
  let claim: string | null = null;
  let inTable = false;
  for (const line of body) {
    const heading = /^\s*CLAIM ([A-Z0-9-]+)( \(CONTINUED\))?(?:\s|$)/.exec(line);
    if (heading) {
      const id = heading[1]!.toLowerCase();
      if (!heading[2]) {
        claim = id;
        inTable = false;
      }
      continue;
    }
    if (claim === null) continue;
    if (/^\s*The numbers\s*$/.test(line)) {
      inTable = true;
      tables.set(claim, []);
      continue;
    }
    if (!inTable) continue;
    if (line.trim() === '') continue;
    // The table's cells are indented; the method line under it starts at the margin.
    if (/^\S/.test(line)) {
      inTable = false;
      continue;
    }
    tables.get(claim)!.push(line);
  }
  return tables;
}

interface Cell {
  start: number;
  text: string;
}

function cells(line: string): Cell[] {
  const out: Cell[] = [];
  const re = /\S+(?: \S+)*/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(line))) out.push({ start: m.index, text: m[0] });
  return out;
}

/** The table's column starts, from the cells' own positions (cells starting within 2 characters share a column). */
function columns(lines: string[]): number[] {
  const starts = [...new Set(lines.flatMap((l) => cells(l).map((c) => c.start)))].sort((a, b) => a - b);
  const cols: number[] = [];
  for (const s of starts) if (cols.length === 0 || s - cols[cols.length - 1]! > 2) cols.push(s);
  return cols;
}

/** The labelled rows of one table, in reading order (left pair before right pair on a shared line). */
export function tableRows(claim: string, lines: string[]): TableRow[] {
  const cols = columns(lines);
  const colOf = (start: number): number => {
    let best = 0;
    for (let i = 0; i < cols.length; i++) if (cols[i]! <= start + 2) best = i;
    return best;
  };
  // Columns alternate label, value, label, value...: a pair is (2k, 2k+1).
  const open = new Map<number, TableRow>();
  const rows: TableRow[] = [];
  for (const line of lines) {
    const byCol = new Map<number, string>();
    for (const c of cells(line)) {
      const k = colOf(c.start);
      byCol.set(k, byCol.has(k) ? `${byCol.get(k)} ${c.text}` : c.text);
    }
    const pairs = new Set([...byCol.keys()].map((k) => Math.floor(k / 2)));
    for (const p of [...pairs].sort((a, b) => a - b)) {
      const label = byCol.get(2 * p);
      const value = byCol.get(2 * p + 1);
      const current = open.get(p);
      // A label and a value on one line start a row, unless the open row's value or label is still inside
      // parentheses (a wrapped "(unadjusted; ... adjusted for 14 claims:" goes on with its own wrapped label).
      if (label !== undefined && value !== undefined && current && (unclosed(current.value) || unclosed(current.label))) {
        current.label = joinWrapped(current.label, label);
        current.value = joinWrapped(current.value, value);
      } else if (label !== undefined && value !== undefined) {
        const row = { claim, label, value };
        rows.push(row);
        open.set(p, row);
      } else if (current && label !== undefined) current.label = joinWrapped(current.label, label);
      else if (current && value !== undefined) current.value = joinWrapped(current.value, value);
      else rows.push({ claim, label: label ?? '', value: value ?? '' });
    }
  }
  return rows;
}

function unclosed(text: string): boolean {
  return (text.match(/\(/g) ?? []).length > (text.match(/\)/g) ?? []).length;
}

/** Text wrapped at a hyphen ("p-" + "values") joins without a space. */
function joinWrapped(a: string, b: string): string {
  return /[A-Za-z]-$/.test(a) ? a + b : `${a} ${b}`;
}

const NUMBER = /(<\s*)?([±+\u2212-]?)(\d+(?:,\d{3})*(?:\.\d+)?)(%?)/g;

/** Words after a number that make it a plain count or score, not a rate. */
const RATE_WORDS = new Set(['points', 'to', 'per', 'either', 'agreed', 'of', 'scale']);

/** The figures printed in a row (its label and value), with the scales each may be on. */
export function rowFigures(row: TableRow, names: ReadonlySet<string>): Array<Omit<Figure, 'found'>> {
  const out: Array<Omit<Figure, 'found'>> = [];
  const text = `${row.label} | ${row.value}`;
  // A row whose figures are in percentage points (not "scale points") carries proportions × 100; a line "(in %)"
  // mixes percentages (its intercept) with plain numbers (its slope, R²). "points per point" is a ratio (the slope of
  // a line through two rates' residuals), not an amount in points.
  const pointsRow = /(?<!scale )points(?! per point)/.test(text);
  const percentRow = /\(in %\)/.test(text);
  let m: RegExpExecArray | null;
  NUMBER.lastIndex = 0;
  while ((m = NUMBER.exec(text))) {
    const before = text.slice(0, m.index);
    // A number inside a word or a name ("Q03", "R²" is not matched; "2024" as a period's name is a name).
    if (/[A-Za-z]$/.test(before)) continue;
    const body = m[3]!;
    if (names.has(body) && !m[4]) continue;
    const after = text.slice(m.index + m[0].length);
    const nextWord = /^\s*([A-Za-z]+)/.exec(after)?.[1];
    const pct = m[4] === '%';
    // A p-value or threshold ("p below 0.00357", "p = 0.385") is a probability whatever the row's unit.
    const probability = /\bp (?:below |=\s*|<\s*)$/.test(before);
    const scales = pct ? [100] : probability || (nextWord && !RATE_WORDS.has(nextWord)) ? [1] : pointsRow ? [100] : percentRow ? [100, 1] : [1];
    out.push({ claim: row.claim, label: row.label, text: m[0].trim(), scales });
  }
  return out;
}

/** Every number in a JSON value (deep), and every string under a "label"/"unit" key (names a row may print). */
export function leaves(value: unknown, numbers: number[] = [], names: Set<string> = new Set(), key = ''): { numbers: number[]; names: Set<string> } {
  if (typeof value === 'number' && Number.isFinite(value)) numbers.push(value);
  else if (typeof value === 'string' && (key === 'label' || key === 'unit' || key === 'row' || key === 'column')) {
    for (const w of value.split(/[^\p{L}\p{N}]+/u)) if (/^\d+$/.test(w)) names.add(w);
  } else if (Array.isArray(value)) for (const v of value) leaves(v, numbers, names, key);
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) leaves(v, numbers, names, k);
  return { numbers, names };
}

/** Whether `printed` is one of `numbers` (on one of `scales`) written at the printed precision. */
export function figureIn(printed: string, scales: number[], numbers: readonly number[]): boolean {
  const m = /^(<\s*)?([±+\u2212-]?)(\d+(?:,\d{3})*(?:\.\d+)?)(%?)$/.exec(printed);
  if (!m) return false;
  const magnitude = Number(m[3]!.replace(/,/g, ''));
  const decimals = m[3]!.includes('.') ? m[3]!.split('.')[1]!.length : 0;
  const sign = m[2] === '\u2212' || m[2] === '-' ? -1 : m[2] === '+' ? 1 : 0;
  const half = 0.5 * 10 ** -decimals + 1e-9;
  return numbers.some((v) =>
    scales.some((s) => {
      const x = v * s;
      // "< 0.001": a value below the printed bound.
      if (m[1]) return x >= 0 && x < magnitude;
      // Signed figures must agree in sign (a zero may print with either); unsigned ones are sizes.
      if (sign !== 0 && Math.abs(x) >= half && Math.sign(x) !== sign) return false;
      return Math.abs(Math.abs(x) - magnitude) <= half;
    }),
  );
}

/**
 * Every figure in every claim's numbers table, each marked found or not in that claim's results.json entry
 * (or in the pack-wide settings, which hold what every claim shares: the level, the adjustment's family, power).
 */
export function checkFigures(layoutText: string, results: { settings: unknown; claims: Array<{ id: string }> }): { rows: TableRow[]; figures: Figure[] } {
  const tables = numbersTables(layoutText);
  const rows: TableRow[] = [];
  const figures: Figure[] = [];
  const shared = leaves(results.settings).numbers;
  for (const [claim, lines] of tables) {
    const entry = results.claims.find((c) => c.id === claim);
    const { numbers, names } = leaves(entry ?? {});
    const all = [...numbers, ...shared];
    for (const row of tableRows(claim, lines)) {
      rows.push(row);
      for (const f of rowFigures(row, names)) figures.push({ ...f, found: entry !== undefined && figureIn(f.text, f.scales, all) });
    }
  }
  return { rows, figures };
}
