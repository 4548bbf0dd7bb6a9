import { once } from 'node:events';
import type { Response } from 'express';
import type { AppContext } from '../app-context';

/** Headers of a file download: its type, its name, and never kept in a shared or browser cache. */
export function attachmentHeaders(res: Response, contentType: string, fileName: string): void {
  res.setHeader('Content-Type', contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${fileName.replace(/[^A-Za-z0-9._-]/g, '_')}"`);
  res.setHeader('Cache-Control', 'no-store');
}

/**
 * A streamed download failed. Before any byte went out, the error is answered as usual (rethrown
 * to the error handler, without the download headers). After that no error body can follow, so
 * the connection is cut: the browser shows a failed download rather than a truncated file.
 * @throws err when the response has not started
 */
export function streamFailed(ctx: AppContext, res: Response, err: unknown, ids: { programId: number; what: string }): void {
  if (!res.headersSent) {
    res.removeHeader('Content-Disposition');
    res.removeHeader('Content-Type');
    throw err;
  }
  ctx.logger.error({ err, programId: ids.programId, download: ids.what }, 'download failed while streaming');
  res.destroy();
}

/** Writes a chunk of a streamed download, waiting when the client reads more slowly than we write. */
export async function writeChunk(res: Response, chunk: string): Promise<void> {
  if (res.write(chunk)) return;
  await once(res, 'drain');
}
