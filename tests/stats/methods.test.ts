import { readdirSync, readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { METHODS } from '../../src/stats/methods.js';

// The pack's method notes come from src/stats/methods.ts: every method name a statistics function can put in its
// result must have notes there, or the pack would use a method it does not describe.
describe('method notes', () => {
  const dir = resolve(__dirname, '../../src/stats');
  const names = new Set<string>();
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
    const text = readFileSync(join(dir, file), 'utf8');
    for (const m of text.matchAll(/method:\s*(?:[^'\n]*\?\s*)?'([a-z0-9-]+)'(?:\s*:\s*'([a-z0-9-]+)')?/g)) {
      if (m[1]) names.add(m[1]);
      if (m[2]) names.add(m[2]);
    }
  }

  it('finds the method names used in src/stats', () => {
    expect(names.has('two-proportion-z')).toBe(true);
    expect(names.size).toBeGreaterThan(15);
  });

  it('has notes, with a published source, for every method a result can name', () => {
    const missing = [...names].filter((n) => !(n in METHODS));
    expect(missing).toEqual([]);
    for (const info of Object.values(METHODS)) {
      expect(info.text.length).toBeGreaterThan(40);
      expect(info.source).toMatch(/\d{4}/);
    }
  });
});
