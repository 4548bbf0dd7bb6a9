import fs from 'node:fs';
import { ingestWorker } from '@server/services/ingest/ingest-worker';
import { ingestFiles } from '@server/services/ingest/work-dir';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ExtractDetailDto } from '@shared/api/extracts';
import { ERROR_CODES } from '@shared/errors';
import { BAD_FILES } from '../fixtures/bad-extract-files';
import { fixtureDir, goodRows, TEST_MAPPING, toCsv } from '../fixtures/extract-files';
import { createTestProgram } from '../fixtures/test-program';
import { acceptAndSettle, postExtract, settledExtract, uploadExtract, visibleState } from '../support/extracts';
import { buildTestApp, type TestApp } from '../support/test-app';
import { createTestDatabase, type TestDatabase } from '../support/test-database';
import { signIn, type SignedInAgent } from '../support/sign-in';

/**
 * The bad-file catalogue (tests/fixtures/bad-extract-files.ts): every file stops at the stage it
 * names with its exact error code and a plain message, and what is visible in the database (the
 * observations, the accepted extract of the month, cohorts) is exactly what it was before.
 */
describe('bad extract files', () => {
  let db: TestDatabase;
  let app: SignedInAgent;
  let t: TestApp;
  let programId: number;
  let sourceId: number;
  let dir: string;
  let incoming: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    programId = await createTestProgram(db.dataSource);
    t = buildTestApp(db);
    app = await signIn(t, { role: 'analyst', programId });
    dir = fixtureDir();
    incoming = ingestFiles(db).incoming();
    // A good extract already accepted for the month, and its mapping saved: the bad files must not touch it.
    const first = await uploadExtract(app, { programId, content: toCsv(goodRows(300, '2025-04', 99)) });
    const mapped = await app
      .put(`/api/programs/${programId}/extracts/${first.extract.id}/mapping`)
      .send({ newSourceName: 'Case system', mapping: TEST_MAPPING })
      .expect(200);
    sourceId = mapped.body.source.id;
    await settledExtract(app, programId, first.extract.id);
    expect((await acceptAndSettle(app, programId, first.extract.id)).status).toBe('accepted');
    await ingestWorker(t.ctx).idle(); // the staging table goes once the swap has committed
  });
  afterAll(async () => {
    fs.rmSync(dir, { recursive: true, force: true });
    await db.drop();
  });

  it('has at least 30 files, each with a known error code', () => {
    expect(BAD_FILES.length).toBeGreaterThanOrEqual(30);
    for (const f of BAD_FILES) expect(ERROR_CODES).toContain(f.code);
    expect(new Set(BAD_FILES.map((f) => f.name)).size).toBe(BAD_FILES.length);
  });

  for (const bad of BAD_FILES) {
    it(`stops ${bad.name} at the ${bad.stage} with ${bad.code}`, async () => {
      const before = await visibleState(db.dataSource);
      const extractsBefore = await db.dataSource.query('SELECT COUNT(*) AS n FROM extract');
      const content = await bad.build(dir);
      const upload = await postExtract(app, { programId, content, fileName: bad.fileName, period: bad.period, sheet: bad.sheet, sourceId });

      if (bad.stage === 'upload') {
        expect(upload.status).toBeGreaterThanOrEqual(400);
        expect(upload.body.error.code).toBe(bad.code);
        expect(upload.body.error.message).toMatch(bad.message);
        expect(await db.dataSource.query('SELECT COUNT(*) AS n FROM extract')).toEqual(extractsBefore);
        expect(fs.readdirSync(incoming)).toEqual([]);
      } else {
        expect(upload.status).toBe(201);
        const id: number = upload.body.extract.id;
        let extract = await settledExtract(app, programId, id);
        if (bad.mapping || extract.status === 'uploaded') {
          const mapped = await app
            .put(`/api/programs/${programId}/extracts/${id}/mapping`)
            .send({ sourceId, mapping: bad.mapping ?? TEST_MAPPING, save: false });
          if (bad.stage === 'mapping') {
            expect(mapped.status).toBeGreaterThanOrEqual(400);
            expect(mapped.body.error.code).toBe(bad.code);
            expect(mapped.body.error.message).toMatch(bad.message);
          } else {
            expect(mapped.status).toBe(200);
            extract = await settledExtract(app, programId, id);
          }
        } else {
          expect(bad.stage).toBe('report');
        }
        if (bad.stage === 'report') {
          expect(extract.status).toBe('awaiting-decision');
          expect(extract.problem?.code).toBe(bad.code);
          expect(extract.problem?.message).toMatch(bad.message);
          expect(extract.canAccept).toBe(false);
          const accept = await app.post(`/api/programs/${programId}/extracts/${id}/accept`).send({});
          expect(accept.status).toBe(409);
          expect(accept.body.error).toMatchObject({ code: 'extract_state_conflict', message: expect.stringContaining('cannot be accepted') });
        }
        const rejected = await app.post(`/api/programs/${programId}/extracts/${id}/reject`).send({ reason: 'bad file' }).expect(200);
        expect((rejected.body as ExtractDetailDto).status).toBe('rejected');
        expect(fs.existsSync(ingestFiles(db).extractDir(id))).toBe(false); // rejecting deletes the upload at once
      }
      expect(await visibleState(db.dataSource)).toEqual(before);
    });
  }
});
