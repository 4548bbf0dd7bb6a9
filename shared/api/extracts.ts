import type { ErrorCode } from '../errors';
import type { ColumnMapping, ExtractFormat, ExtractStatus, IngestSettings } from '../schemas/extract';

/** A stable code and a plain sentence, as in the API's error shape. */
export interface ProblemDto {
  code: ErrorCode;
  message: string;
}

/** Background work on an extract, polled by the client. `unit` says what `done` and `total` count. */
export interface ExtractProgressDto {
  phase: 'validating' | 'loading' | 'publishing';
  done: number;
  total: number;
  unit: 'bytes' | 'rows';
}

export interface ActorStampDto {
  at: string;
  by: string;
}

/** One row of `GET /api/programs/:programId/extracts`. */
export interface ExtractSummaryDto {
  id: number;
  programId: number;
  period: string;
  status: ExtractStatus;
  format: ExtractFormat;
  fileName: string;
  byteSize: number;
  /** SHA-256 of the uploaded file, hex. */
  sha256: string;
  source: { id: number; name: string } | null;
  uploaded: ActorStampDto;
  decided: ActorStampDto | null;
  rowsRead: number | null;
  rowsAccepted: number | null;
  rowsRejected: number | null;
  progress: ExtractProgressDto | null;
  /** A whole-file problem that stops the extract from being accepted, or why processing failed. */
  problem: ProblemDto | null;
  supersededById: number | null;
  /** When the purge job deleted its row-level observations (the record stays). */
  observationsPurgedAt: string | null;
}

/** Rejected rows grouped by reason, most frequent first. */
export interface RejectionGroupDto {
  code: ErrorCode;
  column: string | null;
  count: number;
  /** One plain sentence, e.g. "'hardship_index' is not a number." */
  message: string;
}

/** The validation report: what was read, what would be stored, and why rows were left out. */
export interface ExtractReportDto {
  rowsRead: number;
  rowsAccepted: number;
  rowsRejected: number;
  /** rowsRejected / rowsRead. */
  rejectedShare: number;
  maxRejectedShare: number;
  byReason: RejectionGroupDto[];
  /** How many rejected rows are kept for the table and rejected.csv (all of them up to a cap). */
  rejectedRowsKept: number;
  cutoff: number;
  /** Accepted rows on the eligible and the other side of the cutoff. */
  eligibleRows: number;
  ineligibleRows: number;
  /** Share of accepted rows that took up the program, or null when take-up is not mapped. */
  takeUpShare: number | null;
  score: { min: number; max: number } | null;
  /** Cluster codes among accepted rows, or null when no cluster column is mapped. */
  clusters: number | null;
}

export interface ExtractDetailDto extends ExtractSummaryDto {
  sheet: string | null;
  /** Header of the file, in file order. */
  columns: string[];
  headerFingerprint: string;
  mapping: ColumnMapping | null;
  /** Where the mapping came from: recognised from a saved one, or entered for this file. */
  mappingOrigin: 'saved' | 'entered' | null;
  /** A starting point for the mapping form: the saved mapping of this header, or a guess from column names. */
  suggestedMapping: Partial<ColumnMapping> | null;
  report: ExtractReportDto | null;
  /** Whether the analyst may accept now (awaiting decision, no whole-file problem, under the limit). */
  canAccept: boolean;
  /** Whether the mapping can still be changed (the uploaded file is kept until the decision). */
  canRemap: boolean;
  /** The accepted extract of the same month that accepting this one would supersede. */
  replaces: { id: number; sha256: string; rowsAccepted: number | null; acceptedAt: string | null } | null;
  decisionNote: string | null;
}

/** `POST /api/programs/:programId/extracts` */
export interface ExtractUploadResultDto {
  extract: ExtractDetailDto;
  /** True when the same file (same SHA-256) was uploaded before: nothing new was stored. */
  duplicate: boolean;
}

/** One row of the rejected-rows table and of rejected.csv. */
export interface RejectedRowDto {
  /** Line in the file (CSV) or row number (XLSX), counting the header as 1. */
  line: number;
  column: string | null;
  code: ErrorCode;
  reason: string;
  /** The offending cell, shortened; never the subject identifier. */
  value: string | null;
}

export interface SavedMappingDto {
  id: number;
  headerFingerprint: string;
  columns: string[];
  mapping: ColumnMapping;
  saved: ActorStampDto;
}

/** `GET /api/programs/:programId/data-sources` */
export interface DataSourceDto {
  id: number;
  name: string;
  createdAt: string;
  mappings: SavedMappingDto[];
}

export type IngestSettingsDto = IngestSettings;
