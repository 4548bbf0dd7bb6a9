import { isApiErrorBody } from '@shared/errors';
import { ApiError } from '@/lib/api-client';

/** The file name the server gave in `Content-Disposition`, or a fallback. */
export function attachmentName(header: string | null, fallback: string): string {
  const m = header ? /filename="([^"]+)"/.exec(header) : null;
  return m?.[1] ?? fallback;
}

/**
 * Fetches a file the server builds on request (annex, export) and hands it to the browser as a
 * download. A refusal or failure comes back as the server's plain message (`ApiError`), so the
 * screen can say what went wrong instead of saving an error page as a file.
 * @returns the file name saved
 */
export async function downloadFile(path: string, fallbackName: string): Promise<string> {
  let response: Response;
  try {
    response = await fetch(path, { credentials: 'same-origin' });
  } catch {
    throw new ApiError(0, 'network', 'Cutline could not be reached. Check your connection and try again.');
  }
  if (!response.ok) {
    const body: unknown = await response.json().catch(() => null);
    if (isApiErrorBody(body)) throw new ApiError(response.status, body.error.code, body.error.message, body.error.details);
    throw new ApiError(response.status, 'internal', `The download failed (the server answered ${response.status}). Please try again.`);
  }
  let blob: Blob;
  try {
    blob = await response.blob();
  } catch {
    throw new ApiError(0, 'network', 'The download was interrupted before the file was complete. Please try again.');
  }
  const name = attachmentName(response.headers.get('Content-Disposition'), fallbackName);
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  document.body.append(link);
  link.click();
  link.remove();
  // Give the browser time to start saving before the object URL goes away.
  window.setTimeout(() => URL.revokeObjectURL(url), 60_000);
  return name;
}
