import type { z } from 'zod';
import { imagesApi } from '@toneledger/common/api/images';
import type { imageUploadFieldsSchema } from '@toneledger/common/schemas/images';
import { uploadWithProgress } from '@/lib/api-client';

/** One image to upload: the file and the multipart text fields the server reads beside it (as it reads them). */
export type ImageUpload = z.output<typeof imageUploadFieldsSchema> & { file: File };

/** Uploads one image as multipart form data, reporting progress; resolves with the stored image. */
export function uploadImage(printId: string, upload: ImageUpload, onProgress?: (fraction: number) => void, signal?: AbortSignal) {
  const form = new FormData();
  form.append('viewType', upload.viewType);
  if (upload.capturedOn) form.append('capturedOn', upload.capturedOn);
  if (upload.notes) form.append('notes', upload.notes);
  form.append('file', upload.file, upload.file.name);
  return uploadWithProgress(imagesApi.upload, { params: { id: printId }, body: form, signal }, onProgress);
}
