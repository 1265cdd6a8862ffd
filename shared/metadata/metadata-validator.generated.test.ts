import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { GENERATED_VALIDATOR, metadataValidatorSource } from './compile-metadata-validator';

describe('the ahead-of-time metadata validator', () => {
  it('matches the schema (run `npm run metadata:compile` after changing it)', () => {
    expect(fs.readFileSync(GENERATED_VALIDATOR, 'utf8')).toBe(metadataValidatorSource());
  });

  it('needs neither eval nor require at run time', () => {
    const code = fs.readFileSync(GENERATED_VALIDATOR, 'utf8');
    expect(code).not.toMatch(/\bnew Function\b|\beval\(|require\(/);
  });
});
