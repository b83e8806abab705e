/**
 * results.xlsx: the numbers of results.json as a workbook for people who work in spreadsheets.
 *
 * Sheet "Claims": one row per claim (id, claim, kind, verdict, the verdict's detail, what to do with the claim, why, a
 * suggested wording, key estimate, interval, p, adjusted p, n's, cautions): the verdict and advice in the words of the
 * claim's page in the pack, so the workbook and the pack never disagree. Header row frozen, widths set, proportions formatted as percentages, long text wrapped.
 * Sheet "Selections": each compared selection's n, agreeing count, rate and interval.
 *
 * Safe to open: every text cell is written as an explicit string, and text that a spreadsheet could take for a formula
 * (starting with = + - @, a tab or a carriage return; the OWASP "CSV injection" list, common practice) is prefixed
 * with a single quote, so no cell can run as a formula.
 *
 * Written directly as the parts of an Office Open XML workbook (ECMA-376 Part 1: SpreadsheetML; Part 2: packaging)
 * in a zip file (PKWARE APPNOTE.TXT), each part exactly as exceljs 4.4 writes the same workbook (the writer warrant
 * used before; tests/results/xlsx-same.test.ts compares the two part by part). Loading exceljs and building its
 * workbook model took 0.15 to 0.3 s of every build; this takes a few milliseconds. The parts are compressed with
 * Node's zlib, so the zip's compressed bytes differ from exceljs's (whose zip library deflates in JavaScript);
 * the unzipped parts are the same.
 *
 * Deterministic: the workbook's created/modified dates and the date and time of every zip entry come from the pack
 * date, never the clock, so the same results give the same bytes.
 */
import * as zlib from 'node:zlib';
import { createRequire } from 'node:module';
import type { ClaimResult, ResultsFile } from './results.js';
import { grouped } from '../format/numbers.js';

/** Characters that make a spreadsheet read a cell's text as a formula when they come first. */
const FORMULA_START = /^[=+\-@\t\r]/;

/** Text made safe to put in a cell: a leading formula character is preceded by a single quote. */
export function neutralise(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** The date a workbook is stamped with: the pack date when it is YYYY-MM-DD, else 2000-01-01 (never the clock). */
export function workbookDate(date: string): Date {
  const parsed = /^\d{4}-\d{2}-\d{2}$/.test(date) ? new Date(`${date}T00:00:00Z`) : undefined;
  return parsed && !Number.isNaN(parsed.getTime()) ? parsed : new Date(Date.UTC(2000, 0, 1));
}

/** Does the claim's key estimate measure a proportion (shown as a percentage) rather than, say, a correlation? */
function isProportion(c: ClaimResult): boolean {
  return c.estimate !== null && /proportion|rate|share|percentage/i.test(c.estimate.name);
}

export interface Column {
  header: string;
  width: number;
  wrap?: boolean;
}

/** The columns of the Claims sheet (also used by the exceljs reference writer in the tests). */
export const CLAIM_COLUMNS: readonly Column[] = [
  { header: 'Claim id', width: 24, wrap: true },
  { header: 'Claim', width: 60, wrap: true },
  { header: 'Kind', width: 13 },
  { header: 'Verdict', width: 16 },
  { header: 'Verdict detail', width: 14 },
  { header: 'What to do', width: 16 },
  { header: 'Why', width: 60, wrap: true },
  { header: 'Suggested wording', width: 50, wrap: true },
  { header: 'Key estimate', width: 26, wrap: true },
  { header: 'Estimate', width: 11 },
  { header: 'Interval lower', width: 11 },
  { header: 'Interval upper', width: 11 },
  { header: 'Confidence', width: 11 },
  { header: 'p-value', width: 11 },
  { header: 'Adjusted p-value', width: 11 },
  { header: 'Respondents or units (n)', width: 16, wrap: true },
  { header: 'Cautions', width: 80, wrap: true },
];

/**
 * A claim's verdict and advice as the pack words them: the verdict word of its badge ("Not supported"), the detail
 * the badge adds ("inconclusive", "ruled out", "too small"; empty when there is none), what to do ("Drop"), why, and
 * the wording the data support where the pack suggests one. From results.json's verdictLabel and advice, which are
 * the claim page's own; the bare verdict code only where those are absent.
 */
export function verdictCells(c: ClaimResult): { verdict: string; detail: string; action: string; reason: string; wording: string } {
  const label = c.verdictLabel ?? c.verdict;
  const at = label.indexOf(': ');
  return {
    verdict: at < 0 ? label : label.slice(0, at),
    detail: at < 0 ? '' : label.slice(at + 2),
    action: c.advice?.label ?? '',
    reason: c.advice?.reason ?? '',
    wording: c.advice?.wording ?? '',
  };
}

/** The columns of the Selections sheet. */
export const SELECTION_COLUMNS: readonly Column[] = [
  { header: 'Claim id', width: 24, wrap: true },
  { header: 'Selection', width: 36, wrap: true },
  { header: 'Respondents (n)', width: 14 },
  { header: 'Agreeing', width: 11 },
  { header: 'Rate', width: 9 },
  { header: 'Interval lower', width: 11 },
  { header: 'Interval upper', width: 11 },
  { header: 'Confidence', width: 11 },
  { header: 'Eligible (population)', width: 13 },
  { header: 'Counts approximate', width: 12 },
];

/**
 * Text as XML character data or an attribute value: & < > " ' escaped, and the control characters XML 1.0 does not
 * allow (all below U+0020 but tab, line feed and carriage return; and DEL) left out.
 */
function xmlText(text: string): string {
  // eslint-disable-next-line no-control-regex
  return text.replace(/["&'<>\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/g, (c) =>
    c === '"' ? '&quot;' : c === '&' ? '&amp;' : c === "'" ? '&apos;' : c === '<' ? '&lt;' : c === '>' ? '&gt;' : '',
  );
}

/** A cell's column letters: 1 -> A, 13 -> M, 27 -> AA. */
function columnLetters(n: number): string {
  let s = '';
  for (let k = n; k > 0; k = Math.floor((k - 1) / 26)) s = String.fromCharCode(65 + ((k - 1) % 26)) + s;
  return s;
}

/** Number formats built into every spreadsheet application (ECMA-376 Part 1, 18.8.30); others get ids from 164. */
const BUILT_IN_FORMATS: Record<string, number> = { '0%': 9, '#,##0': 3 };

/**
 * The workbook's cell formats (cellXfs), numbered in the order they are first used: 0 the default, then the wrapped
 * columns' format, the header row's, and one per number format as the cells meet them.
 */
class Styles {
  private readonly xfs = ['<xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0"/>'];
  private readonly byKey = new Map<string, number>();
  private readonly numFmts: string[] = [];

  private add(key: string, xml: string): number {
    let id = this.byKey.get(key);
    if (id === undefined) {
      id = this.xfs.length;
      this.xfs.push(xml);
      this.byKey.set(key, id);
    }
    return id;
  }

  wrapped(): number {
    return this.add('wrap', '<xf numFmtId="0" fontId="0" fillId="0" borderId="0" xfId="0" applyAlignment="1"><alignment vertical="top" wrapText="1"/></xf>');
  }

  header(): number {
    return this.add('header', '<xf numFmtId="0" fontId="1" fillId="0" borderId="0" xfId="0" applyFont="1" applyAlignment="1"><alignment vertical="bottom" wrapText="1"/></xf>');
  }

  number(format: string): number {
    const key = `numFmt ${format}`;
    if (this.byKey.has(key)) return this.byKey.get(key)!;
    let id = BUILT_IN_FORMATS[format];
    if (id === undefined) {
      id = 164 + this.numFmts.length;
      this.numFmts.push(`<numFmt numFmtId="${id}" formatCode="${xmlText(format)}"/>`);
    }
    return this.add(key, `<xf numFmtId="${id}" fontId="0" fillId="0" borderId="0" xfId="0" applyNumberFormat="1"/>`);
  }

  xml(): string {
    return (
      XML_HEAD +
      '<styleSheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" mc:Ignorable="x14ac x16r2" xmlns:x14ac="http://schemas.microsoft.com/office/spreadsheetml/2009/9/ac" xmlns:x16r2="http://schemas.microsoft.com/office/spreadsheetml/2015/02/main">' +
      (this.numFmts.length > 0 ? `<numFmts count="${this.numFmts.length}">${this.numFmts.join('')}</numFmts>` : '') +
      '<fonts count="2" x14ac:knownFonts="1"><font><color theme="1"/><family val="2"/><scheme val="minor"/><sz val="11"/><name val="Calibri"/></font><font><b/></font></fonts>' +
      '<fills count="2"><fill><patternFill patternType="none"/></fill><fill><patternFill patternType="gray125"/></fill></fills>' +
      '<borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders>' +
      '<cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs>' +
      `<cellXfs count="${this.xfs.length}">${this.xfs.join('')}</cellXfs>` +
      '<cellStyles count="1"><cellStyle name="Normal" xfId="0" builtinId="0"/></cellStyles><dxfs count="0"/><tableStyles count="0" defaultTableStyle="TableStyleMedium2" defaultPivotStyle="PivotStyleLight16"/>' +
      '<extLst><ext uri="{EB79DEF2-80B8-43e5-95BD-54CBDDF9020C}" xmlns:x14="http://schemas.microsoft.com/office/spreadsheetml/2009/9/main"><x14:slicerStyles defaultSlicerStyle="SlicerStyleLight1"/></ext><ext uri="{9260A510-F301-46a8-8635-F512D64BE5F5}" xmlns:x15="http://schemas.microsoft.com/office/spreadsheetml/2010/11/main"><x15:timelineStyles defaultTimelineStyle="TimeSlicerStyleLight1"/></ext></extLst></styleSheet>'
    );
  }
}

/** The workbook's shared strings: each distinct text once, cells refer to it by its number. */
class SharedStrings {
  private readonly index = new Map<string, number>();
  private readonly items: string[] = [];
  private uses = 0;

  ref(text: string): number {
    this.uses++;
    let i = this.index.get(text);
    if (i === undefined) {
      i = this.items.length;
      this.index.set(text, i);
      // Leading or trailing white space, or a line break, is kept only when the text says so (xml:space).
      this.items.push(/^\s|\n|\s$/.test(text) ? `<si><t xml:space="preserve">${xmlText(text)}</t></si>` : `<si><t>${xmlText(text)}</t></si>`);
    }
    return i;
  }

  xml(): string {
    return `${XML_HEAD}<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="${this.uses}" uniqueCount="${this.items.length}">${this.items.join('')}</sst>`;
  }
}

const XML_HEAD = '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n';
/** Column widths in characters: a column of this width and no format is the default one and is not listed. */
const DEFAULT_WIDTH = 9;

/** One worksheet, filled a row at a time; cells hold shared-string or number values. */
class Sheet {
  private readonly rows: string[] = [];
  private row: string[] = [];
  private rowNumber = 0;
  private first = 0;
  private last = 0;
  private maxColumn = 0;
  private readonly wrapped = new Set<number>();
  private readonly colsXml: string;

  constructor(
    private readonly columns: readonly Column[],
    private readonly styles: Styles,
    private readonly strings: SharedStrings,
  ) {
    // Adjacent columns alike in width and format share one <col> entry; default columns have none.
    const cols: Array<{ min: number; max: number; width: number; wrap: boolean }> = [];
    let open: (typeof cols)[number] | undefined;
    columns.forEach((c, i) => {
      const wrap = c.wrap === true;
      if (wrap) this.wrapped.add(i + 1);
      if (c.width === DEFAULT_WIDTH && !wrap) open = undefined;
      else if (open && open.width === c.width && open.wrap === wrap) open.max = i + 1;
      else cols.push((open = { min: i + 1, max: i + 1, width: c.width, wrap }));
    });
    this.colsXml = cols
      .map((c) => `<col min="${c.min}" max="${c.max}" width="${c.width}"${c.wrap ? ` style="${styles.wrapped()}"` : ''}${c.width !== DEFAULT_WIDTH ? ' customWidth="1"' : ''}/>`)
      .join('');
  }

  private cell(col: number, attrs: string, value: string): void {
    if (this.row.length === 0) this.first = col;
    this.last = col;
    if (col > this.maxColumn) this.maxColumn = col;
    this.row.push(`<c r="${columnLetters(col)}${this.rowNumber}"${attrs}><v>${value}</v></c>`);
  }

  private endRow(attrs = ''): void {
    if (this.row.length > 0) this.rows.push(`<row r="${this.rowNumber}" spans="${this.first}:${this.last}"${attrs} x14ac:dyDescent="0.25">${this.row.join('')}</row>`);
    this.row = [];
  }

  header(): void {
    this.rowNumber = 1;
    const s = this.styles.header();
    this.columns.forEach((c, i) => this.cell(i + 1, ` s="${s}" t="s"`, String(this.strings.ref(neutralise(c.header)))));
    this.endRow(` s="${s}" customFormat="1"`);
  }

  startRow(): void {
    this.endRow();
    this.rowNumber++;
  }

  text(col: number, text: string): void {
    const style = this.wrapped.has(col) ? ` s="${this.styles.wrapped()}"` : '';
    this.cell(col, `${style} t="s"`, String(this.strings.ref(neutralise(text))));
  }

  number(col: number, value: number | null | undefined, format: string): void {
    if (value === null || value === undefined) return;
    if (!Number.isFinite(value)) throw new Error(`results.xlsx: a value in row ${this.rowNumber}, column ${col} is ${value}; a finite number is required.`);
    this.cell(col, ` s="${this.styles.number(format)}"`, String(value));
  }

  xml(): string {
    this.endRow();
    return (
      XML_HEAD +
      '<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships" xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" mc:Ignorable="x14ac" xmlns:x14ac="http://schemas.microsoft.com/office/spreadsheetml/2009/9/ac">' +
      `<dimension ref="A1:${columnLetters(this.maxColumn)}${this.rowNumber}"/>` +
      '<sheetViews><sheetView workbookViewId="0"><pane ySplit="1" topLeftCell="A2" activePane="bottomLeft" state="frozen"/><selection pane="bottomLeft"/></sheetView></sheetViews>' +
      '<sheetFormatPr defaultRowHeight="15" outlineLevelRow="0" outlineLevelCol="0" x14ac:dyDescent="55"/>' +
      (this.colsXml !== '' ? `<cols>${this.colsXml}</cols>` : '') +
      `<sheetData>${this.rows.join('')}</sheetData>` +
      '<pageMargins left="0.7" right="0.7" top="0.75" bottom="0.75" header="0.3" footer="0.3"/><pageSetup orientation="portrait" horizontalDpi="4294967295" verticalDpi="4294967295" scale="100" fitToWidth="1" fitToHeight="1"/></worksheet>'
    );
  }
}

/** The workbook's theme (colours and fonts the default cell format refers to): the Office theme exceljs ships. */
function themeXml(): string {
  return createRequire(import.meta.url)('exceljs/lib/xlsx/xml/theme1.js') as string;
}

/**
 * Build results.xlsx from results.json's content. Returns the bytes; when `path` is given, also writes them there.
 * The same ResultsFile always gives the same bytes.
 */
export async function writeResultsXlsx(results: ResultsFile, path?: string): Promise<Buffer> {
  const when = workbookDate(results.date);
  const styles = new Styles();
  const strings = new SharedStrings();

  const claims = new Sheet(CLAIM_COLUMNS, styles, strings);
  claims.header();
  for (const c of results.claims) {
    claims.startRow();
    const fmt = isProportion(c) ? '0.0%' : '0.000';
    claims.text(1, c.id);
    claims.text(2, c.statement);
    claims.text(3, c.kind);
    const v = verdictCells(c);
    claims.text(4, v.verdict);
    if (v.detail) claims.text(5, v.detail);
    if (v.action) claims.text(6, v.action);
    if (v.reason) claims.text(7, v.reason);
    if (v.wording) claims.text(8, v.wording);
    if (c.estimate) claims.text(9, c.estimate.name);
    claims.number(10, c.estimate?.value, fmt);
    claims.number(11, c.interval?.lower, fmt);
    claims.number(12, c.interval?.upper, fmt);
    claims.number(13, c.interval?.level ?? c.confidence, '0%');
    claims.number(14, c.p, '0.0000');
    claims.number(15, c.pAdjusted, '0.0000');
    if (c.n.length > 0) claims.text(16, c.n.map(grouped).join('; '));
    if (c.cautions.length > 0) claims.text(17, c.cautions.join('\n'));
  }
  const claimsXml = claims.xml();

  const selections = new Sheet(SELECTION_COLUMNS, styles, strings);
  selections.header();
  for (const c of results.claims) {
    for (const s of c.selections) {
      selections.startRow();
      selections.text(1, c.id);
      selections.text(2, s.label);
      selections.number(3, s.n, '#,##0');
      selections.number(4, s.agree, '#,##0');
      selections.number(5, s.rate, '0.0%');
      selections.number(6, s.interval.lower, '0.0%');
      selections.number(7, s.interval.upper, '0.0%');
      selections.number(8, s.interval.level, '0%');
      selections.number(9, s.population, '#,##0');
      selections.text(10, s.approximate ? 'yes' : 'no');
    }
  }
  const selectionsXml = selections.xml();

  const stamp = when.toISOString().replace(/[.]\d{3}/, '');
  const parts: Array<[string, string | null]> = [
    ['[Content_Types].xml', CONTENT_TYPES],
    ['_rels/', null],
    ['_rels/.rels', ROOT_RELS],
    ['xl/', null],
    ['xl/_rels/', null],
    ['xl/_rels/workbook.xml.rels', WORKBOOK_RELS],
    ['xl/worksheets/', null],
    ['xl/worksheets/sheet1.xml', claimsXml],
    ['xl/worksheets/sheet2.xml', selectionsXml],
    ['xl/sharedStrings.xml', strings.xml()],
    ['xl/theme/', null],
    ['xl/theme/theme1.xml', themeXml()],
    ['xl/styles.xml', styles.xml()],
    ['docProps/', null],
    [
      'docProps/app.xml',
      `${XML_HEAD}<Properties xmlns="http://schemas.openxmlformats.org/officeDocument/2006/extended-properties" xmlns:vt="http://schemas.openxmlformats.org/officeDocument/2006/docPropsVTypes"><Application>Microsoft Excel</Application><DocSecurity>0</DocSecurity><ScaleCrop>false</ScaleCrop><HeadingPairs><vt:vector size="2" baseType="variant"><vt:variant><vt:lpstr>Worksheets</vt:lpstr></vt:variant><vt:variant><vt:i4>2</vt:i4></vt:variant></vt:vector></HeadingPairs><TitlesOfParts><vt:vector size="2" baseType="lpstr"><vt:lpstr>Claims</vt:lpstr><vt:lpstr>Selections</vt:lpstr></vt:vector></TitlesOfParts><Company>${xmlText(results.organisation || '')}</Company><Manager></Manager><LinksUpToDate>false</LinksUpToDate><SharedDoc>false</SharedDoc><HyperlinksChanged>false</HyperlinksChanged><AppVersion>16.0300</AppVersion></Properties>`,
    ],
    [
      'docProps/core.xml',
      `${XML_HEAD}<cp:coreProperties xmlns:cp="http://schemas.openxmlformats.org/package/2006/metadata/core-properties" xmlns:dc="http://purl.org/dc/elements/1.1/" xmlns:dcterms="http://purl.org/dc/terms/" xmlns:dcmitype="http://purl.org/dc/dcmitype/" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance"><dc:creator>${xmlText(`warrant ${results.tool.version}`)}</dc:creator><dc:title>${xmlText(results.title)}</dc:title><dc:subject></dc:subject><dc:description></dc:description><cp:keywords></cp:keywords><cp:category></cp:category><cp:lastModifiedBy>warrant</cp:lastModifiedBy><dcterms:created xsi:type="dcterms:W3CDTF">${stamp}</dcterms:created><dcterms:modified xsi:type="dcterms:W3CDTF">${stamp}</dcterms:modified></cp:coreProperties>`,
    ],
    ['xl/workbook.xml', WORKBOOK],
  ];
  const buffer = zip(parts.map(([name, text]) => [name, text === null ? null : Buffer.from(text, 'utf8')]), when);
  if (path) {
    const { writeFile } = await import('node:fs/promises');
    await writeFile(path, buffer);
  }
  return buffer;
}

const CONTENT_TYPES =
  XML_HEAD +
  '<Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="rels" ContentType="application/vnd.openxmlformats-package.relationships+xml"/><Default Extension="xml" ContentType="application/xml"/><Override PartName="/xl/workbook.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sheet.main+xml"/><Override PartName="/xl/worksheets/sheet1.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/><Override PartName="/xl/worksheets/sheet2.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.worksheet+xml"/><Override PartName="/xl/theme/theme1.xml" ContentType="application/vnd.openxmlformats-officedocument.theme+xml"/><Override PartName="/xl/styles.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.styles+xml"/><Override PartName="/xl/sharedStrings.xml" ContentType="application/vnd.openxmlformats-officedocument.spreadsheetml.sharedStrings+xml"/><Default Extension="vml" ContentType="application/vnd.openxmlformats-officedocument.vmlDrawing"/><Override PartName="/docProps/core.xml" ContentType="application/vnd.openxmlformats-package.core-properties+xml"/><Override PartName="/docProps/app.xml" ContentType="application/vnd.openxmlformats-officedocument.extended-properties+xml"/></Types>';

const ROOT_RELS =
  XML_HEAD +
  '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/officeDocument" Target="xl/workbook.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/package/2006/relationships/metadata/core-properties" Target="docProps/core.xml"/><Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/extended-properties" Target="docProps/app.xml"/></Relationships>';

const WORKBOOK_RELS =
  XML_HEAD +
  '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/styles" Target="styles.xml"/><Relationship Id="rId2" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/theme" Target="theme/theme1.xml"/><Relationship Id="rId3" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/sharedStrings" Target="sharedStrings.xml"/><Relationship Id="rId4" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet1.xml"/><Relationship Id="rId5" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet2.xml"/></Relationships>';

const WORKBOOK =
  XML_HEAD +
  '<workbook xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships" xmlns:mc="http://schemas.openxmlformats.org/markup-compatibility/2006" mc:Ignorable="x15" xmlns:x15="http://schemas.microsoft.com/office/spreadsheetml/2010/11/main"><fileVersion appName="xl" lastEdited="5" lowestEdited="5" rupBuild="9303"/><workbookPr defaultThemeVersion="164011" filterPrivacy="1"/><sheets><sheet sheetId="1" name="Claims" state="visible" r:id="rId4"/><sheet sheetId="2" name="Selections" state="visible" r:id="rId5"/></sheets><calcPr calcId="171027"/></workbook>';

let crcTable: Uint32Array | undefined;

/** Node's own CRC-32 (zlib.crc32, from Node 20.15), when this Node has it. */
const nativeCrc32 = (zlib as { crc32?: (data: Uint8Array) => number }).crc32;

/** CRC-32 as zip uses it (polynomial 0xEDB88320, reflected; PKWARE APPNOTE.TXT 4.4.7). */
export function crc32(data: Uint8Array): number {
  if (nativeCrc32) return nativeCrc32(data);
  return tableCrc32(data);
}

/** The same CRC-32 computed a byte at a time from a table, for Node versions without zlib.crc32. */
export function tableCrc32(data: Uint8Array): number {
  if (!crcTable) {
    crcTable = new Uint32Array(256);
    for (let n = 0; n < 256; n++) {
      let c = n;
      for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
      crcTable[n] = c >>> 0;
    }
  }
  let crc = 0xffffffff;
  for (let i = 0; i < data.length; i++) crc = crcTable[(crc ^ data[i]!) & 0xff]! ^ (crc >>> 8);
  return (crc ^ 0xffffffff) >>> 0;
}

/**
 * A zip file of these entries in this order (a null body is a folder entry), every entry dated `when` (UTC), files
 * deflated (method 8) and folders stored, in the layout of PKWARE APPNOTE.TXT: local file headers (4.3.7), central
 * directory headers (4.3.12) and the end-of-central-directory record (4.3.16). Names are ASCII, so no flag is set.
 */
function zip(entries: Array<[string, Buffer | null]>, when: Date): Buffer {
  const dosTime = (when.getUTCHours() << 11) | (when.getUTCMinutes() << 5) | Math.floor(when.getUTCSeconds() / 2);
  const dosDate = ((when.getUTCFullYear() - 1980) << 9) | ((when.getUTCMonth() + 1) << 5) | when.getUTCDate();
  const chunks: Buffer[] = [];
  const central: Buffer[] = [];
  let offset = 0;
  for (const [nameText, body] of entries) {
    const name = Buffer.from(nameText, 'ascii');
    const data = body === null ? Buffer.alloc(0) : zlib.deflateRawSync(body, { level: 6 });
    const crc = body === null ? 0 : crc32(body);
    const size = body === null ? 0 : body.length;
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(10, 4); // version needed to extract: 1.0
    local.writeUInt16LE(0, 6); // flags
    local.writeUInt16LE(body === null ? 0 : 8, 8);
    local.writeUInt16LE(dosTime, 10);
    local.writeUInt16LE(dosDate, 12);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(data.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(name.length, 26);
    local.writeUInt16LE(0, 28); // extra field length
    const dir = Buffer.alloc(46);
    dir.writeUInt32LE(0x02014b50, 0);
    dir.writeUInt16LE(20, 4); // made by: MS-DOS, version 2.0
    dir.writeUInt16LE(10, 6);
    dir.writeUInt16LE(0, 8);
    dir.writeUInt16LE(body === null ? 0 : 8, 10);
    dir.writeUInt16LE(dosTime, 12);
    dir.writeUInt16LE(dosDate, 14);
    dir.writeUInt32LE(crc, 16);
    dir.writeUInt32LE(data.length, 20);
    dir.writeUInt32LE(size, 24);
    dir.writeUInt16LE(name.length, 28);
    dir.writeUInt32LE(body === null ? 0x10 : 0, 38); // external attributes: MS-DOS directory bit for folders
    dir.writeUInt32LE(offset, 42);
    chunks.push(local, name, data);
    central.push(dir, name);
    offset += local.length + name.length + data.length;
  }
  const directory = Buffer.concat(central);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(entries.length, 8);
  end.writeUInt16LE(entries.length, 10);
  end.writeUInt32LE(directory.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...chunks, directory, end]);
}
