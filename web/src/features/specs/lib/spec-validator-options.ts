/**
 * How rjsf's ajv8 validator is set up for the spec schema (draft-07): our own `x-unit` and `x-typical` keywords
 * are declared so strict schema checking accepts them. The browser does not compile schemas (the
 * server's Content-Security-Policy forbids eval): the validator is precompiled from these
 * options into spec-validators.generated.ts by scripts/compile-spec-validators.ts.
 */
import type { CustomValidatorOptionsType } from '@rjsf/validator-ajv8';

export const SPEC_VALIDATOR_OPTIONS: CustomValidatorOptionsType = {
  ajvOptionsOverrides: { keywords: ['x-unit', 'x-typical'] },
};
