import fs from 'node:fs';
import path from 'node:path';

/**
 * Files of an extract while it is being worked on, under `<varDir>/ingest/<extractId>/`:
 * - `upload.<csv|xlsx>`: the uploaded bytes. Holds raw identifiers, so it is readable by the server's
 *   user only and deleted at the decision (or by the purge job when abandoned).
 * - `clean-<n>.tsv`: accepted rows, already pseudonymised, in chunks for `LOAD DATA`; deleted once loaded.
 * New uploads arrive in `<varDir>/ingest/incoming/` and move into the extract's folder once it exists.
 */
export function ingestRoot(varDir: string): string {
  return path.join(varDir, 'ingest');
}

export function incomingDir(varDir: string): string {
  const dir = path.join(ingestRoot(varDir), 'incoming');
  fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
  return dir;
}

export function extractDir(varDir: string, extractId: number): string {
  return path.join(ingestRoot(varDir), String(extractId));
}

export function uploadPath(varDir: string, extractId: number, format: 'csv' | 'xlsx'): string {
  return path.join(extractDir(varDir, extractId), `upload.${format}`);
}

export function cleanChunkPath(varDir: string, extractId: number, chunk: number): string {
  return path.join(extractDir(varDir, extractId), `clean-${String(chunk).padStart(4, '0')}.tsv`);
}

/** Clean chunk files of an extract, in load order. */
export function listCleanChunks(varDir: string, extractId: number): string[] {
  const dir = extractDir(varDir, extractId);
  if (!fs.existsSync(dir)) return [];
  return fs
    .readdirSync(dir)
    .filter((f) => /^clean-\d{4}\.tsv$/.test(f))
    .sort()
    .map((f) => path.join(dir, f));
}

export function removeCleanChunks(varDir: string, extractId: number): void {
  for (const file of listCleanChunks(varDir, extractId)) fs.rmSync(file, { force: true });
}

export function removeUpload(varDir: string, extractId: number): void {
  for (const format of ['csv', 'xlsx'] as const) fs.rmSync(uploadPath(varDir, extractId, format), { force: true });
}

/** Deletes everything Cutline kept on disk for an extract. */
export function removeExtractDir(varDir: string, extractId: number): void {
  fs.rmSync(extractDir(varDir, extractId), { recursive: true, force: true });
}
