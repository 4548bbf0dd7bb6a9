import { useRef, useState, type DragEvent } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import type { DataSourceDto } from '@shared/api/extracts';
import { PeriodSchema } from '@shared/schemas/program';
import { ProgressBar } from '@/components/ui/progress-bar';
import { ApiError } from '@/lib/api-client';
import { useUploadExtract } from '../api/upload-extract';
import { formatBytes } from './extract-status';

/** The month before the current one, `YYYY-MM`: the usual month a new extract covers. */
function lastMonth(): string {
  const d = new Date();
  d.setUTCDate(1);
  d.setUTCMonth(d.getUTCMonth() - 1);
  return d.toISOString().slice(0, 7);
}

/**
 * Drop or pick a CSV or XLSX file, say which month it covers, and send it with a real transfer
 * progress bar; then go to the extract, where checking progress continues.
 */
export function UploadPanel({ programId, sources, sampleHref }: { programId: number; sources: DataSourceDto[]; sampleHref?: string }) {
  const navigate = useNavigate();
  const upload = useUploadExtract(programId);
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [period, setPeriod] = useState(lastMonth);
  const [sourceId, setSourceId] = useState('');
  const [sheet, setSheet] = useState('');
  const [reviewMapping, setReviewMapping] = useState(false);
  const [dragging, setDragging] = useState(false);
  const [duplicateOf, setDuplicateOf] = useState<number | null>(null);
  const periodOk = PeriodSchema.safeParse(period).success;
  const isXlsx = file?.name.toLowerCase().endsWith('.xlsx') ?? false;

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    const dropped = e.dataTransfer.files[0];
    if (dropped) setFile(dropped);
  };
  const submit = () => {
    if (!file || !periodOk) return;
    setDuplicateOf(null);
    upload.mutate(
      { file, period, sourceId: sourceId ? Number(sourceId) : undefined, sheet: isXlsx && sheet ? sheet : undefined, reviewMapping },
      {
        onSuccess: (result) => {
          if (result.duplicate) setDuplicateOf(result.extract.id);
          else navigate(`/programs/${programId}/extracts/${result.extract.id}`);
        },
      },
    );
  };

  return (
    <section aria-labelledby="upload-heading" className="mb-10 rounded-lg border border-rule bg-panel p-6">
      <h2 id="upload-heading" className="text-lg font-semibold text-ink-900">
        Upload a monthly extract
      </h2>
      <p className="mt-1 text-sm text-ink-700">
        CSV (comma, semicolon, tab or pipe; UTF-8) or an Excel .xlsx workbook, up to 512 MB. Identifiers are replaced by keyed pseudonyms as the file is
        checked; nothing becomes visible until you accept the report.
        {sampleHref ? (
          <>
            {' '}
            Trying Cutline?{' '}
            <a href={sampleHref} className="text-accent-700 underline underline-offset-4">
              Download a regional office’s workbook
            </a>{' '}
            (invented data, November 2026).
          </>
        ) : null}
      </p>
      <div
        onDragOver={(e) => {
          e.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={onDrop}
        className={`mt-5 flex flex-col items-center justify-center rounded-md border-2 border-dashed px-6 py-8 text-center ${dragging ? 'border-accent-500 bg-accent-50' : 'border-ink-300'}`}
      >
        <p className="text-ink-700">{file ? <strong className="font-medium text-ink-900">{file.name}</strong> : 'Drop the file here, or'}</p>
        {file ? <p className="figures mt-1 text-sm text-ink-500">{formatBytes(file.size)}</p> : null}
        <button type="button" onClick={() => input.current?.click()} className="mt-3 rounded border border-ink-300 bg-panel px-3 py-1.5 text-sm hover:border-ink-500">
          {file ? 'Choose another file' : 'Choose a file'}
        </button>
        <input
          ref={input}
          type="file"
          accept=".csv,.txt,.tsv,.xlsx"
          aria-label="Extract file"
          className="sr-only"
          onChange={(e) => setFile(e.target.files?.[0] ?? null)}
        />
      </div>
      <div className="mt-5 grid gap-4 sm:grid-cols-3">
        <label className="text-sm text-ink-700">
          Month the file covers
          <input
            type="month"
            value={period}
            onChange={(e) => setPeriod(e.target.value)}
            className="mt-1 block w-full rounded border border-ink-300 bg-panel px-2 py-1.5"
            aria-invalid={!periodOk}
          />
          {!periodOk ? <span className="mt-1 block text-xs text-serious">Write the month as YYYY-MM, e.g. 2026-10.</span> : null}
        </label>
        <label className="text-sm text-ink-700">
          Data source
          <select value={sourceId} onChange={(e) => setSourceId(e.target.value)} className="mt-1 block w-full rounded border border-ink-300 bg-panel px-2 py-1.5">
            <option value="">Recognise from the columns</option>
            {sources.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        {isXlsx ? (
          <label className="text-sm text-ink-700">
            Worksheet
            <input
              value={sheet}
              onChange={(e) => setSheet(e.target.value)}
              placeholder="the first one"
              className="mt-1 block w-full rounded border border-ink-300 bg-panel px-2 py-1.5"
            />
          </label>
        ) : null}
      </div>
      <label className="mt-4 flex items-center gap-2 text-sm text-ink-700">
        <input type="checkbox" checked={reviewMapping} onChange={(e) => setReviewMapping(e.target.checked)} />
        Let me check the column mapping even if Cutline recognises the columns
      </label>
      {upload.transfer ? (
        <div className="mt-5">
          <ProgressBar label="Sending the file" done={upload.transfer.sent} total={upload.transfer.total} detail={`${formatBytes(upload.transfer.sent)} of ${formatBytes(upload.transfer.total)}`} />
        </div>
      ) : null}
      {upload.isError ? <UploadError error={upload.error} /> : null}
      {duplicateOf !== null ? (
        <p role="status" className="mt-5 rounded-md border border-rule bg-accent-50 px-4 py-3 text-sm text-ink-700">
          This exact file was uploaded before, so nothing new was stored.{' '}
          <Link to={`/programs/${programId}/extracts/${duplicateOf}`} className="text-accent-700 underline underline-offset-4">
            Open that extract
          </Link>
          .
        </p>
      ) : null}
      <div className="mt-5">
        <button
          type="button"
          onClick={submit}
          disabled={!file || !periodOk || upload.isPending}
          className="rounded bg-accent-700 px-4 py-2 font-medium text-white enabled:hover:bg-accent-900 disabled:opacity-50"
        >
          {upload.isPending ? 'Uploading…' : 'Upload'}
        </button>
      </div>
    </section>
  );
}

function UploadError({ error }: { error: Error }) {
  return (
    <div role="alert" className="mt-5 rounded-md border-l-4 border-serious bg-serious-50 px-4 py-3">
      <p className="font-medium text-ink-900">The file was not taken.</p>
      <p className="mt-1 text-sm text-ink-700">{error.message}</p>
      {error instanceof ApiError && error.code !== 'network' ? <p className="mt-1 text-xs text-ink-500">Code: {error.code}</p> : null}
    </div>
  );
}
