import { z } from 'zod';

/** Which side of the cutoff qualifies. A score exactly at the cutoff is always eligible. */
export const ELIGIBLE_SIDES = ['at-or-above', 'at-or-below'] as const;
export const EligibleSideSchema = z.enum(ELIGIBLE_SIDES);
export type EligibleSide = z.infer<typeof EligibleSideSchema>;

/** A cohort period: one calendar month, `YYYY-MM`. */
export const PeriodSchema = z
  .string()
  .regex(/^\d{4}-(0[1-9]|1[0-2])$/, 'A period is a month written YYYY-MM, e.g. 2025-04.');
export type Period = z.infer<typeof PeriodSchema>;

export const VARIABLE_KINDS = ['binary', 'continuous'] as const;
export const VariableKindSchema = z.enum(VARIABLE_KINDS);
export type VariableKind = z.infer<typeof VariableKindSchema>;

export const GOOD_DIRECTIONS = ['higher', 'lower'] as const;
export const GoodDirectionSchema = z.enum(GOOD_DIRECTIONS);
export type GoodDirection = z.infer<typeof GoodDirectionSchema>;

/** A machine key for outcomes and covariates: lower-case words joined by underscores. */
export const VariableKeySchema = z
  .string()
  .regex(/^[a-z][a-z0-9_]{0,62}$/, 'A key starts with a letter and uses only a–z, 0–9 and _.');

export const OutcomeDefinitionSchema = z.object({
  key: VariableKeySchema,
  label: z.string().min(1).max(200),
  unit: z.string().max(60),
  kind: VariableKindSchema,
  goodDirection: GoodDirectionSchema,
});
export type OutcomeDefinitionInput = z.infer<typeof OutcomeDefinitionSchema>;

export const CovariateDefinitionSchema = z.object({
  key: VariableKeySchema,
  label: z.string().min(1).max(200),
  unit: z.string().max(60),
  kind: VariableKindSchema,
});
export type CovariateDefinitionInput = z.infer<typeof CovariateDefinitionSchema>;

export const CutoffChangeSchema = z.object({
  cutoff: z.number().finite(),
  /** First cohort period the cutoff applies to; it holds until the next change. */
  firstPeriod: PeriodSchema,
});
export type CutoffChange = z.infer<typeof CutoffChangeSchema>;

export const ProgramInputSchema = z
  .object({
    slug: z.string().regex(/^[a-z0-9-]{2,64}$/, 'A short name uses a–z, 0–9 and -, 2 to 64 characters.'),
    name: z.string().min(1).max(200),
    description: z.string().max(4000),
    scoreLabel: z.string().min(1).max(200),
    scoreUnit: z.string().max(60),
    scoreMin: z.number().finite(),
    scoreMax: z.number().finite(),
    eligibleSide: EligibleSideSchema,
    timeZone: z.string().min(1).max(64),
    /** Plural noun for the people the program serves, in summaries ("households"). */
    populationLabel: z.string().trim().min(1, 'Name the people it serves, e.g. households.').max(60),
    /** Taking part, as a verb phrase completing "more likely to …" ("take the credit"). */
    takeUpPhrase: z.string().trim().min(1, 'Say what taking part is, e.g. take the credit.').max(100),
  })
  .refine((p) => p.scoreMin < p.scoreMax, { message: 'The lowest possible score must be below the highest.', path: ['scoreMax'] });
export type ProgramInput = z.infer<typeof ProgramInputSchema>;
