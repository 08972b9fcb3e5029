import { errorEnvelopeSchema } from '@toneledger/common/schemas/envelope';
import type { PrintImage } from '@toneledger/common/schemas/images';
import { ApiError } from '@/lib/api-client';

export interface ImageUpload {
  file: File;
  viewType: string;
  capturedOn?: string;
  notes?: string;
}

const STATUS_CODES: Record<number, ApiError['code']> = {
  400: 'validation_failed', 401: 'unauthenticated', 403: 'forbidden', 404: 'not_found', 409: 'conflict',
  413: 'payload_too_large', 415: 'unsupported_media_type', 503: 'service_unavailable',
};

function parse(text: string): unknown {
  try {
    return text ? JSON.parse(text) : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Uploads one image as multipart form data. XMLHttpRequest, not fetch, because only it reports
 * upload progress. Resolves with the stored image; rejects with an ApiError built from the
 * server's error envelope (or from the HTTP status when there is none).
 */
export function uploadImage(printId: string, upload: ImageUpload, onProgress?: (fraction: number) => void, signal?: AbortSignal): Promise<PrintImage> {
  return new Promise((resolve, reject) => {
    const form = new FormData();
    form.append('viewType', upload.viewType);
    if (upload.capturedOn) form.append('capturedOn', upload.capturedOn);
    if (upload.notes) form.append('notes', upload.notes);
    form.append('file', upload.file, upload.file.name);

    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/prints/${encodeURIComponent(printId)}/images`);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress?.(event.loaded / event.total);
    };
    xhr.onload = () => {
      const body = parse(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300 && body && typeof body === 'object' && 'data' in body) {
        onProgress?.(1);
        resolve((body as { data: PrintImage }).data);
        return;
      }
      const envelope = errorEnvelopeSchema.safeParse(body);
      if (envelope.success) {
        const { code, status, message, requestId, details } = envelope.data.error;
        reject(new ApiError({ code, status, message, requestId, details }));
        return;
      }
      reject(
        new ApiError({
          code: STATUS_CODES[xhr.status] ?? 'internal_error',
          status: xhr.status,
          message: `The server answered ${xhr.status}.`,
          requestId: xhr.getResponseHeader('x-request-id'),
        }),
      );
    };
    xhr.onerror = () =>
      reject(new ApiError({ code: 'service_unavailable', status: 0, message: 'Could not reach the server. Check the connection and try again.' }));
    xhr.onabort = () => reject(new DOMException('The upload was cancelled.', 'AbortError'));
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
}
