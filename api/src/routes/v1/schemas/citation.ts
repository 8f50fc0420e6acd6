import { z } from './common.js';

/** Where a rule or limit comes from (see analysis/code-rules/citation.ts). */
export const Citation = z
  .object({
    code: z.string().openapi({ example: 'NFPA 70' }),
    edition: z.union([z.number(), z.string()]).openapi({ example: 2023 }),
    section: z.string().openapi({ example: '210.23(B)(1)' }),
    tag: z.enum(['verified', 'from memory', 'derived', 'common practice, no source']).openapi({
      description: 'How sure the fact is: verified in a public copy, from memory, derived by arithmetic, or a rule of thumb',
    }),
  })
  .openapi('Citation', { description: 'Document, edition and clause a rule rests on (cited, never quoted)' });

export const CircuitWarning = z
  .object({
    ruleId: z.string().openapi({ example: 'nec-240.4-small-conductor' }),
    pointer: z.string().openapi({ description: 'The circuit field concerned (JSON Pointer)', example: '/conductorSize' }),
    message: z.string(),
    citation: Citation.nullable(),
  })
  .openapi('CircuitWarning', { description: 'Something to correct or confirm; never blocks saving' });
