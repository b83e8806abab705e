/**
 * Every sentence in the pack comes from a mustache template in templates/ (one file per sentence, named
 * `<kind>.<part>.mustache`). An organisation can reword any of them without code by passing `--templates DIR`: a file
 * there with the same name replaces the built-in one.
 *
 * Values are inserted as plain text: HTML escaping is off (the output is PDF text), and values are never rendered as
 * templates themselves, so text from a claims file or a data file cannot inject template tags.
 *
 * A replacement must fit: a `.mustache` file in the folder whose name is not a built-in template is refused (with the
 * nearest name), and so is a variable that warrant does not give the template (it would leave a hole in a sentence).
 */
import { existsSync, readdirSync } from 'node:fs';
import { isAbsolute, join, relative } from 'node:path';
import Mustache from 'mustache';
import { InputError } from '../errors.js';
import { fsFailure, readOrdinaryFile, requireOrdinaryFile } from '../files.js';
import { packageRoot } from '../paths.js';
import { closest } from '../suggest.js';

export type View = Record<string, unknown>;

const EXT = '.mustache';
/** A template is a sentence or a short list; anything larger is not a template. */
const MAX_TEMPLATE_BYTES = 256 * 1024;

type Token = [string, string, number, number, Token[]?, ...unknown[]];

/** The variable and section names a template uses (`{{name}}`, `{{{name}}}`, `{{#name}}`, `{{^name}}`), in order. */
function namesIn(tokens: Token[], out: string[] = []): string[] {
  for (const t of tokens) {
    if (t[0] === 'name' || t[0] === '&' || t[0] === '#' || t[0] === '^') out.push(t[1]);
    if (Array.isArray(t[4])) namesIn(t[4], out);
  }
  return out;
}

/** Keys a view offers at any depth a section can reach (objects and the objects in lists). */
function viewKeys(view: unknown, out = new Set<string>(), depth = 0): Set<string> {
  if (depth > 4 || view === null || typeof view !== 'object') return out;
  if (Array.isArray(view)) {
    for (const x of view.slice(0, 20)) viewKeys(x, out, depth + 1);
    return out;
  }
  for (const [k, v] of Object.entries(view as Record<string, unknown>)) {
    out.add(k);
    viewKeys(v, out, depth + 1);
  }
  return out;
}

/** A path as the user would recognise it: relative to the working folder when inside it. */
function displayPathFor(abs: string): string {
  const rel = relative(process.cwd(), abs);
  return rel !== '' && !rel.startsWith('..') && !isAbsolute(rel) ? rel : abs;
}

function builtInDir(): string {
  return join(packageRoot(), 'templates');
}

export class Templates {
  private readonly cache = new Map<string, string>();
  /** Replacements read from the folder, whose variables have not yet been checked against a view. */
  private readonly unchecked = new Set<string>();
  constructor(private readonly overrideDir?: string) {
    if (overrideDir === undefined) return;
    if (!existsSync(overrideDir)) {
      throw new InputError({
        file: overrideDir,
        problem: 'the templates folder does not exist',
        fix: 'pass --templates a folder that holds .mustache files named like those in warrant\'s templates/ folder',
      });
    }
    let names: string[];
    try {
      names = readdirSync(overrideDir);
    } catch (e) {
      throw fsFailure(e, { file: displayPathFor(overrideDir), field: '--templates' }, 'reading the templates folder') ?? e;
    }
    const known = readdirSync(builtInDir()).filter((n) => n.endsWith(EXT));
    for (const n of names) if (n.endsWith(EXT)) requireOrdinaryFile(join(overrideDir, n), { file: displayPathFor(join(overrideDir, n)), field: '--templates' }, 'template');
    const unknown = names.filter((n) => n.endsWith(EXT) && !known.includes(n)).sort();
    if (unknown.length > 0) {
      throw new InputError(
        unknown.map((n) => {
          const near = closest(n.slice(0, -EXT.length), known.map((k) => k.slice(0, -EXT.length)));
          return {
            file: displayPathFor(join(overrideDir, n)),
            field: '--templates',
            found: n,
            problem: 'no built-in template has this name, so this file would replace nothing and its words would never be used',
            fix: near !== undefined
              ? `Did you mean ${near}${EXT}? Rename the file to the name of the template it rewords`
              : `Rename the file to the name of the template it rewords, as in warrant's templates/ folder (${builtInDir()})`,
          };
        }),
      );
    }
  }

  private source(name: string): string {
    const cached = this.cache.get(name);
    if (cached !== undefined) return cached;
    const file = `${name}${EXT}`;
    const override = this.overrideDir ? join(this.overrideDir, file) : undefined;
    const replaced = override !== undefined && existsSync(override);
    const path = replaced ? override : join(builtInDir(), file);
    const shown = displayPathFor(path);
    const bytes = readOrdinaryFile(path, MAX_TEMPLATE_BYTES, { file: shown }, 'template', (size) =>
      new InputError({ file: shown, found: size, problem: `the template is larger than ${MAX_TEMPLATE_BYTES / 1024} KB, far more than a sentence needs`, fix: 'Check that this is a template; each holds one sentence or a short list' }),
    );
    const text = bytes.toString('utf8').replace(/\r\n/g, '\n').replace(/\n+$/, '');
    try {
      Mustache.parse(text);
    } catch (e) {
      throw new InputError({
        file: shown,
        problem: `the template cannot be read: ${(e as Error).message}`,
        fix: 'check that every {{#section}} has a matching {{/section}}',
      });
    }
    // A partial ({{> name}}) would be looked up among partials warrant never passes, and leave a hole.
    const partial = (function find(tokens: Token[]): string | undefined {
      for (const t of tokens) {
        if (t[0] === '>') return t[1];
        const inner = Array.isArray(t[4]) ? find(t[4]) : undefined;
        if (inner !== undefined) return inner;
      }
      return undefined;
    })(Mustache.parse(text) as Token[]);
    if (partial !== undefined) {
      throw new InputError({
        file: shown,
        field: `{{> ${partial}}}`,
        found: partial,
        problem: 'the template includes another template, which warrant templates cannot do, so the sentence would have a hole in it',
        fix: 'Write the words out in this template instead of {{> ...}}',
      });
    }
    this.cache.set(name, text);
    if (replaced) this.unchecked.add(name);
    return text;
  }

  /**
   * A replacement's variables must be ones warrant gives this template: those the built-in template uses, or those
   * in the view it is rendered with. Checked on its first use.
   */
  private checkVariables(name: string, text: string, view: View): void {
    if (!this.unchecked.delete(name)) return;
    const builtIn = readOrdinaryFile(join(builtInDir(), `${name}${EXT}`), MAX_TEMPLATE_BYTES, { file: `${name}${EXT}` }, 'template', () => new InputError({ file: `${name}${EXT}`, problem: 'the built-in template is too large', fix: 'Reinstall warrant' })).toString('utf8');
    const offered = new Set([...namesIn(Mustache.parse(builtIn) as Token[]), ...viewKeys(view)]);
    for (const used of namesIn(Mustache.parse(text) as Token[])) {
      const head = used.split('.')[0] as string;
      if (used === '.' || offered.has(head)) continue;
      const choices = [...offered].sort();
      const near = closest(head, choices);
      throw new InputError({
        file: displayPathFor(join(this.overrideDir as string, `${name}${EXT}`)),
        field: `{{${used}}}`,
        found: used,
        problem: `the template uses a variable that warrant does not give the template ${name}, so the sentence would have a hole in it`,
        fix: `${near !== undefined ? `Did you mean {{${near}}}? ` : ''}The variables this template can use are ${choices.map((c) => `{{${c}}}`).join(', ')}`,
      });
    }
  }

  /** One sentence or paragraph. */
  render(name: string, view: View): string {
    const text = this.source(name);
    this.checkVariables(name, text, view);
    return Mustache.render(text, view, {}, { escape: (s: string) => s }).trim();
  }

  /** A template holding one entry per line (cautions, glossary). Empty lines are dropped. */
  renderLines(name: string, view: View): string[] {
    return this.render(name, view)
      .split('\n')
      .map((l) => l.trim())
      .filter((l) => l.length > 0);
  }
}
