import type { EntityManager } from 'typeorm';

/** The visible extract of one cohort: what results are computed from and stamped with. */
export interface AcceptedExtract {
  extractId: number;
  period: string;
  sha256: string;
  acceptedAt: Date;
  rows: number;
}

/**
 * Every cohort of a program that has an accepted extract whose rows are still kept, in period
 * order. (Ingest keeps one accepted extract per period; a replaced one is `superseded`.)
 */
export async function acceptedExtracts(manager: EntityManager, programId: number): Promise<AcceptedExtract[]> {
  const rows: Array<{ id: number; period: string; sha256: string; accepted_at: Date; rows_accepted: number | null }> = await manager.query(
    `SELECT id, period, sha256, accepted_at, rows_accepted FROM extract
      WHERE program_id = ? AND status = 'accepted' AND observations_purged_at IS NULL
      ORDER BY period`,
    [programId],
  );
  return rows.map((r) => ({
    extractId: Number(r.id),
    period: r.period,
    sha256: r.sha256,
    acceptedAt: new Date(r.accepted_at),
    rows: Number(r.rows_accepted ?? 0),
  }));
}
