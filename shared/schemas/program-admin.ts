import { z } from 'zod';
import { CovariateDefinitionSchema, CutoffChangeSchema, OutcomeDefinitionSchema, ProgramInputSchema } from './program';

const distinct = <T>(items: readonly T[], key: (t: T) => string) => new Set(items.map(key)).size === items.length;

/** `PUT /api/programs/:programId/cutoff-schedule`: the whole schedule, each change from its first month on. */
export const CutoffScheduleInputSchema = z.object({
  changes: z
    .array(CutoffChangeSchema)
    .min(1, 'A program needs at least one cutoff.')
    .max(240)
    .refine((c) => distinct(c, (x) => x.firstPeriod), { message: 'Two cutoffs start in the same month; keep one.' }),
});
export type CutoffScheduleInput = z.infer<typeof CutoffScheduleInputSchema>;

/** `PUT /api/programs/:programId/outcomes`: every outcome, in display order. */
export const OutcomeDefinitionsInputSchema = z.object({
  outcomes: z
    .array(OutcomeDefinitionSchema)
    .min(1, 'A program needs at least one outcome.')
    .max(50)
    .refine((o) => distinct(o, (x) => x.key), { message: 'Two outcomes have the same key.' }),
});
export type OutcomeDefinitionsInput = z.infer<typeof OutcomeDefinitionsInputSchema>;

/** `PUT /api/programs/:programId/covariates`: every covariate (characteristics fixed before applying), in display order. */
export const CovariateDefinitionsInputSchema = z.object({
  covariates: z
    .array(CovariateDefinitionSchema)
    .max(50)
    .refine((c) => distinct(c, (x) => x.key), { message: 'Two covariates have the same key.' }),
});
export type CovariateDefinitionsInput = z.infer<typeof CovariateDefinitionsInputSchema>;

/** `POST /api/admin/programs`: a new program with its first cutoff and outcomes. */
export const ProgramCreateInputSchema = z.object({
  program: ProgramInputSchema,
  cutoffSchedule: CutoffScheduleInputSchema.shape.changes,
  outcomes: OutcomeDefinitionsInputSchema.shape.outcomes,
  covariates: CovariateDefinitionsInputSchema.shape.covariates,
});
export type ProgramCreateInput = z.infer<typeof ProgramCreateInputSchema>;
