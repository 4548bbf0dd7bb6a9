import { findColumn } from '@shared/ingest/column-names';
import { MAX_COVARIATES, MAX_OUTCOMES, ROLE_LABELS, type ColumnMapping } from '@shared/schemas/extract';
import type { VariableKind } from '@shared/schemas/program';
import { AppError } from '../../lib/errors';
import type { ObservationSlots } from '../../entities/extract.entity';
import type { RowRules } from './row-checks';
import { monthIndex } from './values';

/** What validation needs to know about the program. */
export interface ProgramFacts {
  id: number;
  scoreMin: number;
  scoreMax: number;
  eligibleSide: 'at-or-above' | 'at-or-below';
  maxRejectedShare: number;
  /** In display order; slot k holds the k-th definition. */
  outcomes: Array<{ key: string; label: string; kind: VariableKind }>;
  covariates: Array<{ key: string; label: string; kind: VariableKind }>;
}

/**
 * Resolves a mapping against the file's header and the program's definitions.
 * @throws AppError extract_column_missing when a mapped column is not in the file;
 *   extract_mapping_invalid when an outcome is unmapped, a key is unknown or there are too many.
 */
export function buildRowRules(
  mapping: ColumnMapping,
  columns: readonly string[],
  program: ProgramFacts,
  period: string,
  format: 'csv' | 'xlsx',
): RowRules {
  if (program.outcomes.length > MAX_OUTCOMES || program.covariates.length > MAX_COVARIATES) {
    throw new AppError('extract_mapping_invalid', `Cutline stores up to ${MAX_OUTCOMES} outcomes and ${MAX_COVARIATES} covariates a program; this program defines more.`);
  }
  const at = (name: string, role: string): number => {
    const index = findColumn(columns, name);
    if (index < 0) {
      throw new AppError('extract_column_missing', `The file has no column "${name}" (chosen for ${role}). Choose one of the file's columns, or check that this is the right file.`);
    }
    return index;
  };
  const optional = (name: string | undefined, role: string) => (name ? at(name, role) : null);

  const outcomeKeys = new Set(program.outcomes.map((o) => o.key));
  for (const key of Object.keys(mapping.outcomes)) {
    if (!outcomeKeys.has(key)) throw new AppError('extract_mapping_invalid', `The program has no outcome "${key}".`);
  }
  const covariateKeys = new Set(program.covariates.map((c) => c.key));
  for (const key of Object.keys(mapping.covariates)) {
    if (!covariateKeys.has(key)) throw new AppError('extract_mapping_invalid', `The program has no covariate "${key}".`);
  }
  const outcomes = program.outcomes.map((o) => {
    const column = mapping.outcomes[o.key];
    if (!column) throw new AppError('extract_mapping_invalid', `Choose the column holding the outcome "${o.label}": every outcome must be mapped.`);
    return { key: o.key, column: at(column, `the outcome "${o.label}"`), kind: o.kind };
  });
  const covariates = program.covariates.map((c) => {
    const column = mapping.covariates[c.key];
    return { key: c.key, column: column ? at(column, `the covariate "${c.label}"`) : null, kind: c.kind };
  });
  return {
    period,
    periodMonth: monthIndex(period),
    scoreMin: program.scoreMin,
    scoreMax: program.scoreMax,
    headerLength: columns.length,
    strictFieldCount: format === 'csv',
    mapping,
    columns: [...columns],
    subjectId: at(mapping.subjectId, ROLE_LABELS.subjectId!),
    score: at(mapping.score, ROLE_LABELS.score!),
    takeUp: optional(mapping.takeUp, ROLE_LABELS.takeUp!),
    takeUpYes: new Set(mapping.takeUpValues.yes.map((v) => v.trim().toLowerCase())),
    takeUpNo: new Set(mapping.takeUpValues.no.map((v) => v.trim().toLowerCase())),
    periodColumn: optional(mapping.periodColumn, ROLE_LABELS.periodColumn!),
    applicationDate: optional(mapping.applicationDate, ROLE_LABELS.applicationDate!),
    cluster: optional(mapping.cluster, ROLE_LABELS.cluster!),
    outcomes,
    covariates,
  };
}

/** Which slot columns the extract's observations use. */
export function slotsOf(rules: RowRules): ObservationSlots {
  return {
    outcomes: Object.fromEntries(rules.outcomes.map((o, i) => [o.key, i + 1])),
    covariates: Object.fromEntries(rules.covariates.filter((c) => c.column !== null).map((c) => [c.key, rules.covariates.indexOf(c) + 1])),
    takeUp: rules.takeUp !== null,
    cluster: rules.cluster !== null,
  };
}
