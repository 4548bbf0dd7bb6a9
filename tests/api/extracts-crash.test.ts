import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ExtractProgressDto } from '@shared/api/extracts';
import type { ExtractStatus } from '@shared/schemas/extract';
import { loadObservations } from '@server/services/observations.service';
import { goodRows, TEST_MAPPING, toCsv } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract } from '../support/extracts';
import { startServerProcess, type ServerProcess } from '../support/server-process';
import { signIn } from '../support/sign-in';
import { createTestDatabase, type TestDatabase } from '../support/test-database';

/**
 * Crash test: the real server (`server/main.ts`) runs as a child process and is killed with
 * SIGKILL, once while it validates a large file and once in the middle of loading it (after the
 * first of its two LOAD DATA chunks). Each time, nothing of the new file may be visible, the
 * month's previous extract must be intact, and the restarted server must finish the work.
 */
describe('a server killed in the middle of an extract', () => {
  let db: TestDatabase;
  let server: ServerProcess | null = null;
  let programId: number;
  const ROWS = 300_000; // two LOAD DATA chunks of at most 250,000 rows

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = await createTestProgram(db.dataSource);
  });
  afterAll(async () => {
    await server?.stop();
    await db.drop();
  });

  const start = async () => {
    server = await startServerProcess(db.config);
    return signIn({ app: server.url, ctx: { dataSource: db.dataSource } }, { role: 'analyst', programId });
  };
  /** Watches the extract's row in the database (not through the server being killed) until `until` holds. */
  const watch = async (id: number, until: (status: ExtractStatus, progress: ExtractProgressDto | null) => boolean) => {
    for (;;) {
      const [row] = await db.dataSource.query('SELECT status, progress FROM extract WHERE id = ?', [id]);
      const progress = typeof row.progress === 'string' ? (JSON.parse(row.progress) as ExtractProgressDto) : (row.progress as ExtractProgressDto | null);
      if (until(row.status, progress)) return { status: row.status as ExtractStatus, progress };
      if (!['uploaded', 'validating', 'awaiting-decision', 'loading'].includes(row.status)) throw new Error(`extract ended ${row.status} before the crash point`);
      await new Promise((r) => setTimeout(r, 5));
    }
  };

  it('keeps the previous extract, shows nothing partial, and finishes after a restart', { timeout: 300_000 }, async () => {
    let analyst = await start();
    const previousRows = goodRows(200, '2025-04', 61);
    const first = await uploadExtract(analyst, { programId, content: toCsv(previousRows), fileName: 'april.csv' });
    await mapExtract(analyst, programId, first.extract.id, TEST_MAPPING);
    expect((await acceptAndSettle(analyst, programId, first.extract.id)).status).toBe('accepted');
    const visibleBefore = await loadObservations(db.dataSource, programId, ['2025-04']);

    const big = await uploadExtract(analyst, { programId, content: toCsv(goodRows(ROWS, '2025-04', 62)), fileName: 'april-corrected.csv' });
    const id = big.extract.id;
    expect(big.extract.mappingOrigin).toBe('saved');

    // 1. Killed while validating.
    await watch(id, (status, progress) => status === 'validating' && progress !== null && progress.done > 0);
    await server!.kill9();
    const [stuck] = await db.dataSource.query('SELECT status FROM extract WHERE id = ?', [id]);
    expect(stuck.status).toBe('validating');
    await expectPreviousIntact();

    analyst = await start();
    const report = await settledExtract(analyst, programId, id);
    expect(report).toMatchObject({ status: 'awaiting-decision', problem: null, report: { rowsRead: ROWS, rowsAccepted: ROWS } });

    // 2. Killed while loading: after the first chunk, before the swap.
    await analyst.post(`/api/programs/${programId}/extracts/${id}/accept`).send({}).expect(200);
    const seen = await watch(id, (status, progress) => status === 'loading' && progress !== null && progress.phase === 'loading' && progress.done > 0);
    expect(seen.progress!.done).toBeLessThan(ROWS);
    await server!.kill9();
    const [half] = await db.dataSource.query('SELECT status FROM extract WHERE id = ?', [id]);
    expect(half.status).toBe('loading');
    await expectPreviousIntact();

    analyst = await start();
    const done = await settledExtract(analyst, programId, id);
    expect(done.status).toBe('accepted');
    const visibleAfter = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(visibleAfter.n).toBe(ROWS);
    expect(visibleAfter.cohorts[0]!.extractId).toBe(id);
    const old = await analyst.get(`/api/programs/${programId}/extracts/${first.extract.id}`).expect(200);
    expect(old.body).toMatchObject({ status: 'superseded', supersededById: id });
    // The server drops the staging table right after the swap commits: wait for it, then none is left.
    const stages = () => db.dataSource.query("SELECT table_name FROM information_schema.tables WHERE table_schema = DATABASE() AND table_name LIKE 'observation\\_stage\\_%'");
    while ((await stages()).length > 0) await new Promise((r) => setTimeout(r, 20));
    expect(await stages()).toEqual([]);
    const [{ n }] = await db.dataSource.query('SELECT COUNT(*) AS n FROM observation');
    expect(Number(n)).toBe(ROWS + previousRows.length);

    async function expectPreviousIntact(): Promise<void> {
      const visible = await loadObservations(db.dataSource, programId, ['2025-04']);
      expect(visible.n).toBe(visibleBefore.n);
      expect(visible.cohorts).toEqual(visibleBefore.cohorts);
      expect(Array.from(visible.score)).toEqual(Array.from(visibleBefore.score));
      const [{ count }] = await db.dataSource.query('SELECT COUNT(*) AS count FROM observation');
      expect(Number(count)).toBe(previousRows.length);
      const [prev] = await db.dataSource.query('SELECT status FROM extract WHERE id = ?', [first.extract.id]);
      expect(prev.status).toBe('accepted');
    }
  });
});
