import { z } from 'zod';
import { PageQuerySchema } from './paging';
import { PeriodSchema, VariableKeySchema } from './program';

/**
 * Life of an extract:
 * uploaded (needs a column mapping) → validating → awaiting-decision → loading → accepted,
 * or rejected (by the analyst), failed (processing broke; retry), superseded (a later file for the
 * same month was accepted; can be restored).
 */
export const EXTRACT_STATUSES = [
  'uploaded',
  'validating',
  'awaiting-decision',
  'loading',
  'accepted',
  'rejected',
  'failed',
  'superseded',
] as const;
export const ExtractStatusSchema = z.enum(EXTRACT_STATUSES);
export type ExtractStatus = z.infer<typeof ExtractStatusSchema>;

/** Statuses in which background work is under way (the client polls these). */
export const EXTRACT_BUSY_STATUSES: readonly ExtractStatus[] = ['validating', 'loading'];

export const EXTRACT_FORMATS = ['csv', 'xlsx'] as const;
export type ExtractFormat = (typeof EXTRACT_FORMATS)[number];

/** How application dates are written in the file (Excel date cells are read as dates whatever this says). */
export const DATE_FORMATS = ['YYYY-MM-DD', 'DD/MM/YYYY', 'MM/DD/YYYY'] as const;
export type DateFormat = (typeof DATE_FORMATS)[number];

/** Most outcome and covariate columns one program can store (typed slot columns, see DEVELOPERS.md). */
export const MAX_OUTCOMES = 8;
export const MAX_COVARIATES = 8;

/** A column of the file, by its header text. */
const ColumnNameSchema = z.string().trim().min(1, 'Choose a column.').max(200);
const OptionalColumnSchema = z.preprocess((v) => (v === '' || v === null ? undefined : v), ColumnNameSchema.optional());

const CodeListSchema = z
  .array(z.string().trim().min(1).max(40))
  .min(1, 'List at least one value.')
  .max(20);

/**
 * How the file's columns map to the roles Cutline needs. Saved per data source and header, so next
 * month's file with the same columns maps itself.
 */
export const ColumnMappingSchema = z
  .object({
    subjectId: ColumnNameSchema,
    score: ColumnNameSchema,
    /** Optional for sharp designs; when given, `takeUpValues` says which codes mean what. */
    takeUp: OptionalColumnSchema,
    takeUpValues: z
      .object({
        /** Codes meaning "took up", compared without case and surrounding spaces, e.g. ["1", "yes"]. */
        yes: CodeListSchema,
        /** Codes meaning "did not take up", e.g. ["0", "no"]. */
        no: CodeListSchema,
      })
      .default({ yes: ['1'], no: ['0'] }),
    /** A column holding the cohort period (`YYYY-MM`) of each row; rows of another month are rejected. */
    periodColumn: OptionalColumnSchema,
    /** A column holding the application date; rows dated outside the extract's month are rejected. */
    applicationDate: OptionalColumnSchema,
    dateFormat: z.enum(DATE_FORMATS).default('YYYY-MM-DD'),
    /** A grouping (office, caseworker, family) for cluster-robust variance; stored as a keyed hash code. */
    cluster: OptionalColumnSchema,
    /** Outcome key → column. Every outcome the program defines must be mapped. */
    outcomes: z.record(VariableKeySchema, ColumnNameSchema),
    /** Covariate key → column; unmapped covariates are stored as missing. */
    covariates: z.record(VariableKeySchema, ColumnNameSchema).default({}),
    decimalSeparator: z.enum(['.', ',']).default('.'),
  })
  .superRefine((m, ctx) => {
    const yes = new Set(m.takeUpValues.yes.map((v) => v.toLowerCase()));
    const both = m.takeUpValues.no.filter((v) => yes.has(v.toLowerCase()));
    if (both.length > 0) {
      ctx.addIssue({ code: 'custom', path: ['takeUpValues', 'no'], message: `"${both[0]}" cannot mean both "took up" and "did not".` });
    }
    const roles: Array<[string, string | undefined]> = [
      ['subjectId', m.subjectId],
      ['score', m.score],
      ['takeUp', m.takeUp],
      ['periodColumn', m.periodColumn],
      ['applicationDate', m.applicationDate],
    ];
    const seen = new Map<string, string>();
    for (const [role, column] of roles) {
      if (!column) continue;
      const key = column.toLowerCase();
      const other = seen.get(key);
      if (other) ctx.addIssue({ code: 'custom', path: [role], message: `The column "${column}" is already used for ${ROLE_LABELS[other] ?? other}.` });
      else seen.set(key, role);
    }
    if (seen.has(m.score.toLowerCase()) && Object.values(m.outcomes).some((c) => c.toLowerCase() === m.score.toLowerCase())) {
      ctx.addIssue({ code: 'custom', path: ['outcomes'], message: 'The score column cannot also be an outcome.' });
    }
  });
export type ColumnMapping = z.infer<typeof ColumnMappingSchema>;
/** What a form or API caller sends (defaults not yet applied). */
export type ColumnMappingInput = z.input<typeof ColumnMappingSchema>;

/** Plain names of the mapping roles, for messages. */
export const ROLE_LABELS: Record<string, string> = {
  subjectId: 'the subject identifier',
  score: 'the score',
  takeUp: 'take-up',
  periodColumn: 'the cohort period',
  applicationDate: 'the application date',
  cluster: 'the cluster',
};

/** Form fields sent with the file in `POST /api/programs/:programId/extracts` (multipart). */
export const ExtractUploadFieldsSchema = z.object({
  period: PeriodSchema,
  /** The data source the file comes from; when absent, Cutline recognises it from a saved mapping. */
  sourceId: z.coerce.number().int().positive().optional(),
  /** XLSX only: the worksheet to read (the first one when absent). */
  sheet: z.string().trim().min(1).max(100).optional(),
  /** Stop after reading the header even when a saved mapping fits, so the analyst can check it. */
  reviewMapping: z
    .enum(['true', 'false'])
    .optional()
    .transform((v) => v === 'true'),
});
export type ExtractUploadFields = z.infer<typeof ExtractUploadFieldsSchema>;

/** `PUT …/extracts/:extractId/mapping`: a mapping for this file, and the data source to save it under. */
export const ExtractMappingRequestSchema = z
  .object({
    sourceId: z.number().int().positive().optional(),
    /** Creates a data source of this name instead of choosing one. */
    newSourceName: z.string().trim().min(1).max(120).optional(),
    mapping: ColumnMappingSchema,
    /** Save the mapping so files with the same header map themselves (default yes). */
    save: z.boolean().default(true),
  })
  .refine((r) => (r.sourceId === undefined) !== (r.newSourceName === undefined), {
    message: 'Choose a data source, or name a new one.',
    path: ['sourceId'],
  });
export type ExtractMappingRequest = z.infer<typeof ExtractMappingRequestSchema>;

export const ExtractAcceptRequestSchema = z.object({ note: z.string().trim().max(500).optional() }).default({});
export const ExtractRejectRequestSchema = z.object({ reason: z.string().trim().max(500).optional() }).default({});
export type ExtractRejectRequest = z.infer<typeof ExtractRejectRequestSchema>;

export const ExtractListQuerySchema = PageQuerySchema.extend({
  status: ExtractStatusSchema.optional(),
  period: PeriodSchema.optional(),
});
export type ExtractListQuery = z.infer<typeof ExtractListQuerySchema>;

export const DataSourceInputSchema = z.object({ name: z.string().trim().min(1, 'Give the data source a name.').max(120) });
export type DataSourceInput = z.infer<typeof DataSourceInputSchema>;

/** Per-program ingest rules (admins set them). */
export const IngestSettingsSchema = z.object({
  /** Largest share of rejected rows an extract may have and still be accepted, 0–0.5 (default 0.02 = 2%). */
  maxRejectedShare: z.number().min(0).max(0.5),
  /** Months of row-level observations kept; older ones are purged (results stay). 1–240, default 36. */
  retentionMonths: z.number().int().min(1).max(240),
});
export type IngestSettings = z.infer<typeof IngestSettingsSchema>;
