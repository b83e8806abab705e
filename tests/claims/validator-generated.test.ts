import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
// @ts-expect-error a plain ES module script without type declarations
import { claimsValidatorSource, GENERATED_PATH } from '../../scripts/claims-validator.mjs';

describe('the generated claims validator', () => {
  it('is the code ajv makes from schema/claims.schema.json as it is now', () => {
    // When this fails, the schema (or ajv) changed after the validator was generated: run
    // `node scripts/claims-validator.mjs` and commit src/claims/claims-validator.generated.ts with the schema.
    const now = (claimsValidatorSource as () => string)();
    const kept = readFileSync(GENERATED_PATH as string, 'utf8');
    expect(kept === now, 'src/claims/claims-validator.generated.ts is out of date: run node scripts/claims-validator.mjs').toBe(true);
  });
});
