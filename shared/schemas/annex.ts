import { z } from 'zod';
import { PeriodSchema } from './program';

/** `GET …/annex?period=`: one cohort's annex; without it, the whole program's. */
export const AnnexQuerySchema = z.object({ period: PeriodSchema.optional() });
export type AnnexQuery = z.infer<typeof AnnexQuerySchema>;

/** `GET …/exports/deidentified?from=&to=`: a range of cohorts (both or neither); without it, every cohort. */
export const DeidentifiedExportQuerySchema = z
  .object({ from: PeriodSchema.optional(), to: PeriodSchema.optional() })
  .refine((q) => (q.from === undefined) === (q.to === undefined), { message: 'Give both the first and the last cohort (from and to), or neither.', path: ['to'] })
  .refine((q) => q.from === undefined || q.to === undefined || q.from <= q.to, { message: 'The first cohort must not be after the last.', path: ['to'] });
export type DeidentifiedExportQuery = z.infer<typeof DeidentifiedExportQuerySchema>;
