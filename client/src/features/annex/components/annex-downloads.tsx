import { ANNEX_ROLES, DEIDENTIFIED_EXPORT_ROLES, annexPath, deidentifiedExportPath } from '@shared/api/annex';
import { useSignedInUser } from '@/features/auth/me-context';
import { holdsRoleForProgram } from '@/features/auth/permissions';
import { DownloadButton } from './download-button';

/**
 * The technical annex (Excel) of a program, or of one month when `period` is given. Shown only to
 * the roles the server lets download it (`ANNEX_ROLES`); nothing is rendered for anyone else.
 */
export function AnnexDownloadButton({ programId, period }: { programId: number; period?: string }) {
  const me = useSignedInUser();
  if (!holdsRoleForProgram(me, ANNEX_ROLES, programId)) return null;
  return (
    <DownloadButton
      path={annexPath(programId, period)}
      fallbackName={`cutline-annex-${period ?? 'all'}.xlsx`}
      label={period ? 'Technical annex for this month (Excel)' : 'Technical annex, all months (Excel)'}
      workingLabel="Preparing the workbook…"
    />
  );
}

/**
 * The row-level de-identified data (CSV) of a month or a range of months, for evaluators only.
 * Every download is recorded in the audit trail, which the button says.
 */
export function DeidentifiedExportButton({ programId, range }: { programId: number; range?: { from: string; to: string } }) {
  const me = useSignedInUser();
  if (!holdsRoleForProgram(me, DEIDENTIFIED_EXPORT_ROLES, programId)) return null;
  const which = range ? (range.from === range.to ? 'this month' : `${range.from} to ${range.to}`) : 'all months';
  return (
    <DownloadButton
      path={deidentifiedExportPath(programId, range)}
      fallbackName="cutline-deidentified.csv"
      label={`De-identified data, ${which} (CSV, download recorded)`}
      workingLabel="Preparing the data…"
    />
  );
}

/** The downloads of a program or month, side by side, for a page's header actions. */
export function AnnexDownloads({ programId, period }: { programId: number; period?: string }) {
  return (
    <span className="inline-flex flex-wrap items-start gap-3">
      <AnnexDownloadButton programId={programId} period={period} />
      <DeidentifiedExportButton programId={programId} range={period ? { from: period, to: period } : undefined} />
    </span>
  );
}
