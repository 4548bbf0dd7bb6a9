import { createHmac } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { ingestWorker } from '@server/services/ingest/ingest-worker';
import { ingestFiles } from '@server/services/ingest/work-dir';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadObservations } from '@server/services/observations.service';
import { goodRows, TEST_MAPPING, toCsv } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, mapExtract, settledExtract, uploadExtract, visibleState } from '../support/extracts';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { signIn, type SignedInAgent } from '../support/sign-in';

describe('extracts: duplicates, supersede, restore, pseudonymisation', () => {
  let db: TestDatabase;
  let app: SignedInAgent;
  let t: TestApp;
  let programId: number;
  const april = goodRows(120, '2025-04', 51);
  const corrected = goodRows(140, '2025-04', 52);
  let firstId: number;
  let secondId: number;

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = await createTestProgram(db.dataSource);
    t = buildTestApp(db);
    app = await signIn(t, { role: 'analyst', programId });
    const up = await uploadExtract(app, { programId, content: toCsv(april) });
    await mapExtract(app, programId, up.extract.id, TEST_MAPPING);
    await acceptAndSettle(app, programId, up.extract.id);
    await ingestWorker(t.ctx).idle(); // the staging table goes once the swap has committed
    firstId = up.extract.id;
  });
  afterAll(async () => {
    await db.drop();
  });

  it('recognises the same file uploaded again and stores nothing new', async () => {
    const before = await visibleState(db.dataSource);
    const [{ n }] = await db.dataSource.query('SELECT COUNT(*) AS n FROM extract');
    const again = await app.post(`/api/programs/${programId}/extracts`).field('period', '2025-04').attach('file', Buffer.from(toCsv(april)), 'again.csv').expect(200);
    expect(again.body).toMatchObject({ duplicate: true, extract: { id: firstId, status: 'accepted' } });
    expect(await db.dataSource.query('SELECT COUNT(*) AS n FROM extract')).toEqual([{ n }]);
    expect(await visibleState(db.dataSource)).toEqual(before);
    // Accepting again is harmless too.
    await app.post(`/api/programs/${programId}/extracts/${firstId}/accept`).send({}).expect(200);
    expect(await visibleState(db.dataSource)).toEqual(before);
  });

  it('lets a corrected file for the month supersede the earlier one, which stays on record', async () => {
    const up = await uploadExtract(app, { programId, content: toCsv(corrected), fileName: 'april-corrected.csv' });
    secondId = up.extract.id;
    const report = await settledExtract(app, programId, secondId);
    expect(report.replaces).toMatchObject({ id: firstId, rowsAccepted: 120 });
    await acceptAndSettle(app, programId, secondId);
    await ingestWorker(t.ctx).idle();

    const data = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(data.n).toBe(140);
    expect(Array.from(data.score)).toEqual(corrected.map((r) => r.score));
    const old = await app.get(`/api/programs/${programId}/extracts/${firstId}`).expect(200);
    expect(old.body).toMatchObject({ status: 'superseded', supersededById: secondId, rowsAccepted: 120, sha256: expect.stringMatching(/^[0-9a-f]{64}$/) });
    const [{ n }] = await db.dataSource.query('SELECT COUNT(*) AS n FROM observation');
    expect(Number(n)).toBe(260);
  });

  it('restores the earlier extract and back again, each in one step', async () => {
    await app.post(`/api/programs/${programId}/extracts/${firstId}/restore`).send({}).expect(200);
    let data = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(Array.from(data.score)).toEqual(april.map((r) => r.score));
    expect(data.cohorts[0]!.extractId).toBe(firstId);
    const second = await app.get(`/api/programs/${programId}/extracts/${secondId}`).expect(200);
    expect(second.body).toMatchObject({ status: 'superseded', supersededById: firstId });

    await app.post(`/api/programs/${programId}/extracts/${secondId}/restore`).send({}).expect(200);
    data = await loadObservations(db.dataSource, programId, ['2025-04']);
    expect(data.n).toBe(140);
    const conflict = await app.post(`/api/programs/${programId}/extracts/${secondId}/restore`).send({}).expect(409);
    expect(conflict.body.error.code).toBe('extract_state_conflict');
  });

  it('records uploads, mappings, accepts, supersedes and restores in the audit trail', async () => {
    const events: Array<{ action: string; subject_id: string }> = await db.dataSource.query(
      "SELECT action, subject_id FROM audit_event WHERE program_id = ? AND subject_type IN ('extract', 'mapping') ORDER BY id",
      [programId],
    );
    expect(events.map((e) => e.action)).toEqual([
      'extract.upload',
      'mapping.save',
      'extract.accept',
      'extract.upload',
      'extract.supersede',
      'extract.accept',
      'extract.restore',
      'extract.restore',
    ]);
    // Each change of the month's visible data queued a recompute with it (joined while one waits).
    const runs = await db.dataSource.query('SELECT `trigger`, status FROM recompute_run WHERE program_id = ?', [programId]);
    expect(runs).toEqual([{ trigger: 'extract-accepted', status: 'queued' }]);
  });

  it('stores subject identifiers only as HMAC-SHA-256 pseudonyms, and no raw identifier anywhere', async () => {
    const rows: Array<{ row_no: number; subject_hash: Buffer }> = await db.dataSource.query(
      'SELECT row_no, subject_hash FROM observation WHERE extract_id = ? ORDER BY row_no LIMIT 3',
      [firstId],
    );
    for (const row of rows) {
      const raw = String(april[row.row_no - 2]!.case_id);
      const expected = createHmac('sha256', db.config.secrets.pseudonymKey).update(`subject\u0000${programId}\u0000${raw}`).digest();
      expect(Buffer.compare(row.subject_hash, expected)).toBe(0);
    }
    // Every table, every text: no raw case number, no date or other unmapped value of the files.
    const tables: Array<{ name: string }> = await db.dataSource.query('SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()');
    const raw = [...april, ...corrected].map((r) => String(r.case_id));
    for (const { name } of tables) {
      const dump = JSON.stringify(await db.dataSource.query(`SELECT * FROM \`${name}\``));
      for (const id of raw) expect(dump.includes(id), `${id} found in ${name}`).toBe(false);
    }
    // Nor on disk once accepted and tidied up.
    await ingestWorker(t.ctx).idle();
    const root = ingestFiles(db).root;
    expect(fs.readdirSync(root).filter((f) => f !== 'incoming')).toEqual([]);
    expect(fs.readdirSync(path.join(root, 'incoming'))).toEqual([]);
  });
});
