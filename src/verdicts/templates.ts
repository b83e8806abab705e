/**
 * Every sentence in the pack comes from a mustache template in templates/ (one file per sentence, named
 * `<kind>.<part>.mustache`). An organisation can reword any of them without code by passing `--templates DIR`: a file
 * there with the same name replaces the built-in one.
 *
 * Values are inserted as plain text: HTML escaping is off (the output is PDF text), and values are never rendered as
 * templates themselves, so text from a claims file or a data file cannot inject template tags.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import Mustache from 'mustache';
import { InputError } from '../errors.js';
import { packageRoot } from '../paths.js';

export type View = Record<string, unknown>;

export class Templates {
  private readonly cache = new Map<string, string>();
  constructor(private readonly overrideDir?: string) {
    if (overrideDir !== undefined && !existsSync(overrideDir)) {
      throw new InputError({
        file: overrideDir,
        problem: 'the templates folder does not exist',
        fix: 'pass --templates a folder that holds .mustache files named like those in warrant\'s templates/ folder',
      });
    }
  }

  private source(name: string): string {
    const cached = this.cache.get(name);
    if (cached !== undefined) return cached;
    const file = `${name}.mustache`;
    const override = this.overrideDir ? join(this.overrideDir, file) : undefined;
    const path = override && existsSync(override) ? override : join(packageRoot(), 'templates', file);
    const text = readFileSync(path, 'utf8').replace(/\r\n/g, '\n').replace(/\n+$/, '');
    try {
      Mustache.parse(text);
    } catch (e) {
      throw new InputError({
        file: path,
        problem: `the template cannot be read: ${(e as Error).message}`,
        fix: 'check that every {{#section}} has a matching {{/section}}',
      });
    }
    this.cache.set(name, text);
    return text;
  }

  /** One sentence or paragraph. */
  render(name: string, view: View): string {
    return Mustache.render(this.source(name), view, {}, { escape: (s: string) => s }).trim();
  }

  /** A template holding one entry per line (cautions, glossary). Empty lines are dropped. */
  renderLines(name: string, view: View): string[] {
    return this.render(name, view)
      .split('\n')
      .map((l) => l.trim())
      .filter((l) => l.length > 0);
  }
}
