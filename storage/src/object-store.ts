import type { Readable } from 'node:stream';

/** What the app needs from object storage; S3 in production, s3rver on a developer machine. */
export interface ObjectStore {
  readonly bucket: string;
  put(key: string, body: Buffer | Readable, options?: { contentType?: string; contentLength?: number }): Promise<void>;
  get(key: string): Promise<Readable>;
  head(key: string): Promise<{ size: number; contentType?: string } | null>;
  delete(key: string): Promise<void>;
  /** Resolves when the bucket answers; throws otherwise. */
  ping(timeoutMs?: number): Promise<void>;
}
