import type { ExtractReportDto, ProblemDto, RejectionGroupDto } from '@shared/api/extracts';
import type { EligibleSide } from '@shared/schemas/program';
import type { GroupCount, PassResult } from './validate-pass';

export interface VerdictInput {
  period: string;
  cutoff: number;
  eligibleSide: EligibleSide;
  maxRejectedShare: number;
  maxRows: number;
}

const n = (v: number) => v.toLocaleString('en');
const pct = (v: number) => `${(100 * v).toLocaleString('en', { maximumFractionDigits: 1 })}%`;

/**
 * The validation report and, when the file as a whole cannot be used, the one problem that stops
 * it, checked in this order: no rows, too many rows, the wrong month, repeated subjects, too many
 * rejected rows, all scores on one side of the cutoff, no variation in take-up.
 */
export function judge(pass: PassResult, v: VerdictInput): { report: ExtractReportDto; problem: ProblemDto | null } {
  const rejectedShare = pass.rowsRead === 0 ? 0 : pass.rowsRejected / pass.rowsRead;
  const report: ExtractReportDto = {
    rowsRead: pass.rowsRead,
    rowsAccepted: pass.rowsAccepted,
    rowsRejected: pass.rowsRejected,
    rejectedShare,
    maxRejectedShare: v.maxRejectedShare,
    byReason: pass.groups.map(groupDto),
    rejectedRowsKept: pass.rejectedKept,
    cutoff: v.cutoff,
    eligibleRows: pass.eligibleRows,
    ineligibleRows: pass.ineligibleRows,
    takeUpShare: pass.takeUpRows === 0 ? null : pass.takeUpOnes / pass.takeUpRows,
    score: pass.rowsAccepted === 0 ? null : { min: pass.scoreMin, max: pass.scoreMax },
    clusters: pass.clusters === 0 ? null : pass.clusters,
  };
  return { report, problem: wholeFileProblem(pass, v, rejectedShare) };
}

function wholeFileProblem(pass: PassResult, v: VerdictInput, rejectedShare: number): ProblemDto | null {
  if (pass.rowsRead === 0) {
    return { code: 'extract_empty', message: 'The file has a header but no data rows. Export the month again and upload the new file.' };
  }
  if (pass.tooManyRows) {
    return { code: 'extract_too_many_rows', message: `The file has more than ${n(v.maxRows)} rows, the most one extract may hold. Split it by month or office.` };
  }
  const wrongMonth = otherMonth(pass);
  if (wrongMonth && wrongMonth.count * 2 > pass.rowsRead) {
    return {
      code: 'extract_wrong_period',
      message:
        `Most rows (${n(wrongMonth.count)} of ${n(pass.rowsRead)}) belong to ${wrongMonth.period}, not ${v.period} as chosen for this upload. ` +
        'Upload it again with the right month, or check that this is the right file.',
    };
  }
  if (pass.duplicates) {
    const d = pass.duplicates;
    return {
      code: 'extract_duplicate_subject',
      message:
        `The same subject appears more than once in this month: line ${n(d.repeatsLine)} repeats line ${n(d.firstLine)}` +
        `${d.count > 1 ? ` (${n(d.count)} repeated rows in all)` : ''}. Each subject must appear once per cohort; correct the export and upload it again.`,
    };
  }
  if (rejectedShare > v.maxRejectedShare) {
    const top = pass.groups[0]!;
    return {
      code: top.code,
      message:
        `${n(pass.rowsRejected)} of ${n(pass.rowsRead)} rows (${pct(rejectedShare)}) have problems, more than this program's limit of ${pct(v.maxRejectedShare)}. ` +
        `Most common: ${groupMessage(top)} (${n(top.count)} rows). See the rejected rows, correct the file or the column mapping, and try again.`,
    };
  }
  const side = v.eligibleSide === 'at-or-above' ? ['at or above', 'below'] : ['at or below', 'above'];
  if (pass.ineligibleRows === 0 || pass.eligibleRows === 0) {
    const where = pass.ineligibleRows === 0 ? side[0] : side[1];
    return {
      code: 'extract_scores_one_side',
      message:
        `Every accepted score is ${where} the cutoff of ${v.cutoff} (all ${n(pass.rowsAccepted)} rows), so there is nobody to compare across the cutoff. ` +
        'Check the score column and the month.',
    };
  }
  if (pass.takeUpRows > 0 && (pass.takeUpOnes === 0 || pass.takeUpOnes === pass.takeUpRows)) {
    const value = pass.takeUpOnes === 0 ? '"did not take up"' : '"took up"';
    return {
      code: 'extract_take_up_constant',
      message: `Every accepted row says ${value}, so the take-up jump cannot be measured. Check the take-up column and its codes in the mapping.`,
    };
  }
  return null;
}

/** The most common month that rows were dated in, other than the extract's. */
function otherMonth(pass: PassResult): { period: string; count: number } | null {
  let best: { period: string; count: number } | null = null;
  for (const g of pass.groups) {
    if (g.code !== 'extract_date_outside_period' && g.code !== 'extract_period_mismatch') continue;
    for (const [period, count] of g.quoted) if (!best || count > best.count) best = { period, count };
  }
  return best;
}

function groupDto(g: GroupCount): RejectionGroupDto {
  return { code: g.code, column: g.column, count: g.count, message: groupMessage(g) };
}

/** A group's reason; for unknown take-up codes, the codes themselves (never identifiers). */
function groupMessage(g: GroupCount): string {
  if (g.code === 'extract_take_up_unknown' && g.quoted.size > 0) {
    const codes = [...g.quoted.entries()].sort((a, b) => b[1] - a[1]).slice(0, 5).map(([c]) => `"${c}"`);
    return `'${g.column}' holds take-up codes not listed in the mapping: ${codes.join(', ')}${g.quoted.size > 5 ? ' …' : ''}`;
  }
  if (g.code === 'extract_duplicate_subject') return 'the same subject appears again';
  if (g.code === 'extract_row_malformed') return 'rows have another number of fields than the header';
  return g.reason.replace(/\.$/, '').replace(/^The /, 'the ');
}
