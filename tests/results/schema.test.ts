/**
 * schema/results.schema.json documents every field: what it is, its scale and which test it belongs to (a field
 * without a description is a field a reader must guess at).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';

const schema = JSON.parse(readFileSync(new URL('../../schema/results.schema.json', import.meta.url), 'utf8'));

function undocumented(node: unknown, path: string, out: string[]): string[] {
  if (node === null || typeof node !== 'object') return out;
  const n = node as Record<string, unknown>;
  if (n.properties && typeof n.properties === 'object') {
    for (const [k, v] of Object.entries(n.properties as Record<string, Record<string, unknown>>)) {
      const desc = v.description;
      if (typeof desc !== 'string' || desc.trim().length < 10) out.push(`${path}/${k}`);
      undocumented(v, `${path}/${k}`, out);
    }
  }
  if (n.items) undocumented(n.items, `${path}[]`, out);
  for (const key of ['anyOf', 'oneOf', 'allOf']) if (Array.isArray(n[key])) for (const x of n[key] as unknown[]) undocumented(x, path, out);
  if (n.definitions) for (const [k, v] of Object.entries(n.definitions as Record<string, unknown>)) undocumented(v, `#${k}`, out);
  return out;
}

describe('results.json schema', () => {
  it('describes every field', () => {
    expect(undocumented(schema, '', [])).toEqual([]);
  });
  it('names the scale of every proportion-valued field it defines', () => {
    const text = JSON.stringify(schema.properties.claims.items.properties);
    for (const field of ['selections', 'difference', 'slope', 'detectable', 'effectiveAlpha']) {
      expect(JSON.stringify(schema.properties.claims.items.properties[field])).toMatch(/proportion|probability/);
    }
    expect(text).toContain('percentage points');
  });
});
