/**
 * The JSON Schema of the claims file (schema/claims.schema.json, shipped with the package so that editors with a
 * YAML language server can check claims files as they are typed), and its validator: ajv's code for the schema,
 * generated ahead of time into claims-validator.generated.ts by scripts/claims-validator.mjs (loading ajv's compiler
 * and compiling the schema took about 0.15 s of every build; tests/claims/validator-generated.test.ts fails when the
 * generated file no longer matches the schema).
 * The schema is located by walking up from this module to the package's package.json, so the same code works from
 * src/ (under vitest) and from dist/ (after tsc).
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { ValidateFunction } from 'ajv';
import { validate as generatedValidator } from './claims-validator.generated.js';

export const SCHEMA_RELATIVE_PATH = join('schema', 'claims.schema.json');

/** The schema's shape, as far as this module reads it. */
export interface JsonSchema {
  description?: string;
  type?: string | string[];
  properties?: Record<string, JsonSchema | boolean>;
  required?: string[];
  enum?: unknown[];
  definitions?: Record<string, JsonSchema>;
  allOf?: Array<{ if?: JsonSchema; then?: JsonSchema }>;
  const?: unknown;
  $ref?: string;
  [key: string]: unknown;
}

/** The folder holding warrant's package.json. */
export function packageRoot(): string {
  let dir = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const candidate = join(dir, 'package.json');
    if (existsSync(candidate)) {
      try {
        const pkg = JSON.parse(readFileSync(candidate, 'utf8')) as { name?: unknown };
        if (pkg.name === 'warrant') return dir;
      } catch {
        // not ours; keep walking
      }
    }
    const parent = dirname(dir);
    if (parent === dir) throw new Error('warrant could not find its own package.json above ' + fileURLToPath(import.meta.url));
    dir = parent;
  }
}

/** Absolute path of the shipped schema file. */
export function claimsSchemaPath(): string {
  return join(packageRoot(), SCHEMA_RELATIVE_PATH);
}

let cachedSchema: JsonSchema | undefined;

export function claimsSchema(): JsonSchema {
  cachedSchema ??= JSON.parse(readFileSync(claimsSchemaPath(), 'utf8')) as JsonSchema;
  return cachedSchema;
}

/**
 * The validator (ajv with allErrors, verbose and allowUnionTypes): all errors at once, with the failing schema attached
 * (verbose) for message building.
 */
export function claimsValidator(): ValidateFunction {
  return generatedValidator as unknown as ValidateFunction;
}
