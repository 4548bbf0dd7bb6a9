import { randomBytes } from 'node:crypto';
import { once } from 'node:events';
import fs from 'node:fs';
import { Router, type RequestHandler } from 'express';
import multer from 'multer';
import { PageQuerySchema } from '@shared/schemas/paging';
import {
  ExtractAcceptRequestSchema,
  ExtractListQuerySchema,
  ExtractMappingRequestSchema,
  ExtractRejectRequestSchema,
  ExtractUploadFieldsSchema,
} from '@shared/schemas/extract';
import type { AccessRule } from '../http/access';
import { allow } from '../http/access';
import { actorOf } from '../http/current-user';
import { idParam, parse } from '../http/validate';
import { AppError, badRequest } from '../lib/errors';
import { acceptExtract, rejectExtract, restoreExtract, retryExtract, setExtractMapping } from '../services/extract-decisions.service';
import { receiveExtract } from '../services/extract-upload.service';
import { findExtract, getExtractDetail, listExtracts, listRejectedRows, writeRejectedCsv } from '../services/extracts.service';
import { ingestFiles } from '../services/ingest/work-dir';
import type { AppContext } from '../app-context';

/** Largest upload, in bytes (512 MiB; extracts of 2 million rows are about 100–200 MB). */
export const MAX_UPLOAD_BYTES = 512 * 1024 * 1024;

const readers: AccessRule = { kind: 'roles', roles: ['analyst', 'admin', 'evaluator'], scope: 'program' };
const analysts: AccessRule = { kind: 'roles', roles: ['analyst'], scope: 'program' };

export function extractRoutes(ctx: AppContext, router: Router = Router()): Router {
  const base = '/programs/:programId/extracts';
  const ids = (params: Record<string, string | string[] | undefined>) => ({
    programId: idParam(params.programId, 'Program id'),
    extractId: idParam(params.extractId, 'Extract id'),
  });

  router.get(base, allow(readers), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    res.json(await listExtracts(ctx.dataSource, programId, parse(ExtractListQuerySchema, req.query)));
  });

  router.post(base, allow(analysts), uploadOne(ctx), async (req, res) => {
    const programId = idParam(req.params.programId, 'Program id');
    const file = req.file;
    if (!file) throw badRequest('Choose a file to upload (form field "file").');
    let fields;
    try {
      fields = parse(ExtractUploadFieldsSchema, req.body);
    } catch (err) {
      fs.rmSync(file.path, { force: true });
      throw err;
    }
    const result = await receiveExtract(ctx, programId, actorOf(req), { path: file.path, originalName: file.originalname }, fields);
    res.status(result.duplicate ? 200 : 201).json(result);
  });

  router.get(`${base}/:extractId`, allow(readers), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await getExtractDetail(ctx, programId, extractId));
  });

  router.get(`${base}/:extractId/rejected-rows`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await listRejectedRows(ctx.dataSource, programId, extractId, parse(PageQuerySchema, req.query)));
  });

  router.get(`${base}/:extractId/rejected.csv`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    const extract = await findExtract(ctx.dataSource, programId, extractId);
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader('Content-Disposition', `attachment; filename="extract-${extract.id}-${extract.period}-rejected.csv"`);
    res.setHeader('Cache-Control', 'no-store');
    await writeRejectedCsv(ctx.dataSource, extract.id, async (chunk) => {
      if (!res.write(chunk)) await once(res, 'drain');
    });
    res.end();
  });

  router.put(`${base}/:extractId/mapping`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await setExtractMapping(ctx, programId, extractId, actorOf(req), parse(ExtractMappingRequestSchema, req.body)));
  });

  router.post(`${base}/:extractId/accept`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    const body = parse(ExtractAcceptRequestSchema, req.body ?? {});
    res.json(await acceptExtract(ctx, programId, extractId, actorOf(req), body.note));
  });

  router.post(`${base}/:extractId/reject`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await rejectExtract(ctx, programId, extractId, actorOf(req), parse(ExtractRejectRequestSchema, req.body ?? {})));
  });

  router.post(`${base}/:extractId/restore`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await restoreExtract(ctx, programId, extractId, actorOf(req)));
  });

  router.post(`${base}/:extractId/retry`, allow(analysts), async (req, res) => {
    const { programId, extractId } = ids(req.params);
    res.json(await retryExtract(ctx, programId, extractId));
  });

  return router;
}

/**
 * Multipart upload of one file straight to disk under var/ingest/incoming (never into memory),
 * with the size limit; multer's errors become the API's plain ones.
 */
function uploadOne(ctx: AppContext): RequestHandler {
  const upload = multer({
    storage: multer.diskStorage({
      destination: (_req, _file, cb) => cb(null, ingestFiles(ctx).incoming()),
      filename: (_req, _file, cb) => cb(null, `${Date.now()}-${randomBytes(8).toString('hex')}.part`),
    }),
    limits: { fileSize: MAX_UPLOAD_BYTES, files: 1, fields: 10, fieldSize: 10_000 },
  }).single('file');
  return (req, res, next) => {
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') {
          return next(
            new AppError(
              'payload_too_large',
              `The file is larger than ${MAX_UPLOAD_BYTES / 1024 / 1024} MB, the most one upload may be. Leave out columns Cutline does not use, or export CSV instead of .xlsx, and upload it again.`,
            ),
          );
        }
        return next(badRequest(`The upload form is not as expected (${err.code}). Send one file in the field "file".`));
      }
      return next(badRequest('The upload stopped before the whole file arrived. Try again.'));
    });
  };
}
