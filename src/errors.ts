/**
 * Errors that reach the user. An InputError is a problem with something the user gave us (a claims file, a data
 * file, an option): the CLI prints its one-paragraph message and exits with code 2, never a stack trace.
 * Anything else that escapes is a bug in warrant and is reported as such.
 */

export interface Problem {
  /** The file the problem is in, as the user would recognise it (relative to the working folder when possible). */
  file: string;
  /** 1-based line in a text file (claims file, CSV). */
  line?: number;
  /** 1-based column in a text file. */
  column?: number;
  /** 1-based row in a spreadsheet or CSV (data row as numbered in the user's program). */
  row?: number;
  /** Sheet name in a workbook. */
  sheet?: string;
  /** The field, column or key concerned. */
  field?: string;
  /** What was found, quoted in the message. */
  found?: string;
  /** What is wrong, as a sentence without a trailing full stop. */
  problem: string;
  /** How to fix it, as an imperative sentence without a trailing full stop. */
  fix: string;
}

/** Where a problem is, written as file:line:column or file, sheet "S", row N. */
export function formatPlace(p: Problem): string {
  let place = p.file;
  if (p.line !== undefined) {
    place += `:${p.line}`;
    if (p.column !== undefined) place += `:${p.column}`;
  }
  if (p.sheet !== undefined) place += `, sheet "${p.sheet}"`;
  if (p.row !== undefined) place += `, row ${p.row}`;
  return place;
}

/** One paragraph: place, problem, field and value found, fix. */
export function formatProblem(p: Problem): string {
  const parts = [`${formatPlace(p)}: ${p.problem}`];
  const detail: string[] = [];
  if (p.field !== undefined) detail.push(`field "${p.field}"`);
  if (p.found !== undefined) detail.push(`found ${JSON.stringify(p.found)}`);
  if (detail.length > 0) parts[0] += ` (${detail.join(', ')})`;
  parts[0] += '.';
  parts.push(`Fix: ${p.fix}.`);
  return parts.join(' ');
}

/** How many problems a message spells out; the rest are counted (a broken or hostile file can hold thousands). */
export const PROBLEMS_SHOWN = 30;

/**
 * The paragraphs of a list of problems: each of the first PROBLEMS_SHOWN in full, then one paragraph counting the rest
 * and saying where the first of them is, so that a file with thousands of mistakes gives a message a person can read.
 */
export function formatProblems(list: readonly Problem[], more = 'warrant check --json lists every one'): string {
  const shown = list.slice(0, PROBLEMS_SHOWN).map(formatProblem);
  const rest = list.length - shown.length;
  if (rest > 0) {
    const next = list[PROBLEMS_SHOWN] as Problem;
    shown.push(
      `... and ${rest.toLocaleString('en-GB')} more problem${rest === 1 ? '' : 's'}, the next at ${formatPlace(next)}. Fix: Correct the ones above first and run again; ${more}.`,
    );
  }
  return shown.join('\n\n');
}

/** A problem with the user's input. Carries one or more problems so that a check can report them all at once. */
export class InputError extends Error {
  readonly problems: Problem[];
  constructor(problems: Problem | Problem[]) {
    const list = Array.isArray(problems) ? problems : [problems];
    super(formatProblems(list));
    this.name = 'InputError';
    this.problems = list;
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}
