import fs from 'node:fs';
import path from 'node:path';
import type { DataSource } from 'typeorm';

/**
 * Files of extracts while they are worked on, under `<varDir>/ingest/<database>/` (the database
 * name keeps two databases on one machine, such as parallel test files, from sharing extract ids):
 * - `incoming/`: uploads as they arrive, before their extract exists;
 * - `<extractId>/upload.<csv|xlsx>`: the uploaded bytes. They hold raw identifiers, so the folder is
 *   readable by the server's user only, and the file is deleted at the decision (or by the purge
 *   job when abandoned);
 * - `<extractId>/clean-<n>.tsv`: accepted rows, already pseudonymised, in chunks for `LOAD DATA`;
 *   deleted once loaded.
 */
export class IngestFiles {
  constructor(readonly root: string) {}

  incoming(): string {
    const dir = path.join(this.root, 'incoming');
    fs.mkdirSync(dir, { recursive: true, mode: 0o700 });
    return dir;
  }

  extractDir(extractId: number): string {
    return path.join(this.root, String(extractId));
  }

  upload(extractId: number, format: 'csv' | 'xlsx'): string {
    return path.join(this.extractDir(extractId), `upload.${format}`);
  }

  chunk(extractId: number, n: number): string {
    return path.join(this.extractDir(extractId), `clean-${String(n).padStart(4, '0')}.tsv`);
  }

  /** Clean chunk files of an extract, in load order. */
  chunks(extractId: number): string[] {
    const dir = this.extractDir(extractId);
    if (!fs.existsSync(dir)) return [];
    return fs
      .readdirSync(dir)
      .filter((f) => /^clean-\d{4}\.tsv$/.test(f))
      .sort()
      .map((f) => path.join(dir, f));
  }

  removeChunks(extractId: number): void {
    for (const file of this.chunks(extractId)) fs.rmSync(file, { force: true });
  }

  removeUpload(extractId: number): void {
    for (const format of ['csv', 'xlsx'] as const) fs.rmSync(this.upload(extractId, format), { force: true });
  }

  /** Deletes everything kept on disk for an extract. */
  removeExtract(extractId: number): void {
    fs.rmSync(this.extractDir(extractId), { recursive: true, force: true });
  }
}

/** The ingest files of the database `dataSource` points at. */
export function ingestFiles(deps: { config: { varDir: string }; dataSource: DataSource }): IngestFiles {
  return new IngestFiles(path.join(deps.config.varDir, 'ingest', String(deps.dataSource.options.database)));
}
