import type { ProgramDetailDto } from '@shared/api/programs';
import type { DesignSettings } from '@shared/schemas/design';

/** What a column of the de-identified export holds. */
export type ExportColumnRole = 'period' | 'cutoff' | 'score' | 'score-centred' | 'take-up' | 'outcome' | 'covariate' | 'cluster';

export interface ExportColumn {
  /** Header in the CSV file. */
  name: string;
  role: ExportColumnRole;
  /** Outcome or covariate key (for those roles). */
  key: string | null;
  /** Plain label, e.g. "Utility shut-off within 6 months". */
  label: string;
  unit: string;
  /** What the values are, in one or two sentences (shown in the annex's Data dictionary). */
  description: string;
}

/** Names of the fixed columns; an outcome or covariate key equal to one of them gets a prefix. */
const FIXED_NAMES = ['period', 'cutoff', 'score', 'score_centred', 'take_up', 'cluster'];

/**
 * The columns of the row-level de-identified export, in file order. One definition serves the
 * export itself and the annex's Data dictionary, so the two cannot disagree. No identifier of any
 * kind is a column: not the subject identifier, not its pseudonym, not the row's position in the
 * uploaded file, not application dates, not office names.
 *
 * @param options.cluster include the cluster column (only when the design clusters its variance,
 *   because the command line needs it to reproduce those standard errors)
 */
export function exportColumns(program: ProgramDetailDto, options: { cluster: boolean }): ExportColumn[] {
  const side = program.eligibleSide === 'at-or-above' ? 'at or above' : 'at or below';
  const variable = (prefix: 'outcome' | 'covariate', key: string) => (FIXED_NAMES.includes(key) ? `${prefix}_${key}` : key);
  return [
    {
      name: 'period',
      role: 'period',
      key: null,
      label: 'Cohort',
      unit: 'YYYY-MM',
      description: 'The monthly cohort (extract period) the applicant belongs to.',
    },
    {
      name: 'cutoff',
      role: 'cutoff',
      key: null,
      label: 'Cutoff in force',
      unit: program.scoreUnit,
      description: `The cutoff that applied to the cohort; applicants scoring ${side} it qualify.`,
    },
    {
      name: 'score',
      role: 'score',
      key: null,
      label: program.scoreLabel,
      unit: program.scoreUnit,
      description: 'The score (running variable) as recorded in the extract.',
    },
    {
      name: 'score_centred',
      role: 'score-centred',
      key: null,
      label: `${program.scoreLabel}, measured from the cutoff`,
      unit: program.scoreUnit,
      description: `score − cutoff, computed as Cutline computes it. Pooled windows are estimated on this column with cutoff 0 (eligible ${side} 0).`,
    },
    {
      name: 'take_up',
      role: 'take-up',
      key: null,
      label: 'Took part',
      unit: '0/1',
      description: '1 when the applicant received the program, 0 when not (the extract’s mapped take-up column); empty when missing.',
    },
    ...program.outcomes.map<ExportColumn>((o) => ({
      name: variable('outcome', o.key),
      role: 'outcome',
      key: o.key,
      label: o.label,
      unit: o.unit,
      description: `Outcome “${o.label}” (${o.kind === 'binary' ? '0/1' : o.unit}); empty when missing.`,
    })),
    ...program.covariates.map<ExportColumn>((c) => ({
      name: variable('covariate', c.key),
      role: 'covariate',
      key: c.key,
      label: c.label,
      unit: c.unit,
      description: `Pre-determined characteristic “${c.label}” (${c.kind === 'binary' ? '0/1' : c.unit}), used for balance checks; empty when missing.`,
    })),
    ...(options.cluster
      ? [
          {
            name: 'cluster',
            role: 'cluster' as const,
            key: null,
            label: 'Cluster (group)',
            unit: 'code',
            description: 'Group used for cluster-robust variance, numbered 1, 2, … afresh in each download: the numbers do not name or link to any office or case.',
          },
        ]
      : []),
  ];
}

/** The column of an outcome (by key) in the export. */
export function outcomeColumn(columns: readonly ExportColumn[], key: string): string | null {
  return columns.find((c) => c.role === 'outcome' && c.key === key)?.name ?? null;
}

/** The export's file name for a range of cohorts of a program. */
export function exportFileName(programSlug: string, from: string, to: string): string {
  return `cutline-deidentified-${programSlug}-${from === to ? from : `${from}-to-${to}`}.csv`;
}

/**
 * Whether the export carries the cluster column: when any version of the program's primary design
 * clusters its variance, so the command line can reproduce every stored result of that design.
 */
export function clusterExported(versions: ReadonlyArray<{ settings: DesignSettings }>): boolean {
  return versions.some((v) => v.settings.cluster === 'cluster-column');
}
