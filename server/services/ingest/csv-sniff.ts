import fs from 'node:fs';
import { AppError } from '../../lib/errors';

const CANDIDATES = [',', ';', '\t', '|'] as const;
const SAMPLE_BYTES = 64 * 1024;

/**
 * Looks at the start of a CSV file: refuses text that is not UTF-8 (UTF-16, binary) and finds the
 * delimiter of the header line: the candidate (comma, semicolon, tab, pipe) that occurs most often
 * outside quotes; a tie or none at all means comma.
 * @throws AppError extract_empty | extract_encoding_invalid
 */
export function sniffCsv(file: string): { delimiter: string } {
  const fd = fs.openSync(file, 'r');
  let sample: Buffer;
  try {
    const buffer = Buffer.alloc(SAMPLE_BYTES);
    const n = fs.readSync(fd, buffer, 0, SAMPLE_BYTES, 0);
    sample = buffer.subarray(0, n);
  } finally {
    fs.closeSync(fd);
  }
  if (sample.length === 0) throw new AppError('extract_empty', 'The file is empty. Export the month again and upload the new file.');
  if ((sample[0] === 0xff && sample[1] === 0xfe) || (sample[0] === 0xfe && sample[1] === 0xff)) {
    throw new AppError(
      'extract_encoding_invalid',
      'The file is saved as UTF-16 text. Save it as "CSV UTF-8" (comma-separated, UTF-8) and upload it again.',
    );
  }
  if (sample.includes(0)) {
    throw new AppError(
      'extract_encoding_invalid',
      'The file holds binary data, not text. Upload the CSV export itself (or an .xlsx workbook), not another kind of file.',
    );
  }
  const text = new TextDecoder('utf-8').decode(sample).replace(/^\uFEFF/, '');
  return { delimiter: headerDelimiter(firstLine(text)) };
}

function firstLine(text: string): string {
  for (const line of text.split(/\r\n|\n|\r/)) if (line.trim() !== '') return line;
  return '';
}

/** @example headerDelimiter('a;b;"c;d"') // => ';' */
export function headerDelimiter(line: string): string {
  const counts = new Map<string, number>(CANDIDATES.map((c) => [c, 0]));
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && counts.has(ch)) counts.set(ch, (counts.get(ch) ?? 0) + 1);
  }
  let best = ',';
  let bestCount = 0;
  for (const c of CANDIDATES) {
    const n = counts.get(c) ?? 0;
    if (n > bestCount) {
      best = c;
      bestCount = n;
    }
  }
  return best;
}
