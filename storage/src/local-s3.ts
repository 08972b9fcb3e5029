import { mkdirSync } from 'node:fs';
import S3rver from 's3rver';

export interface LocalS3 {
  endpoint: string;
  stop(): Promise<void>;
}

/** s3rver on loopback, for development and tests only. Its credentials are fixed. */
export const LOCAL_S3_CREDENTIALS = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } as const;

export async function startLocalS3(options: { port: number; directory: string; bucket: string }): Promise<LocalS3> {
  mkdirSync(options.directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: options.port,
    silent: true,
    directory: options.directory,
    configureBuckets: [{ name: options.bucket, configs: [] }],
  });
  const addr = (await server.run()) as { address: string; port: number };
  return {
    endpoint: `http://127.0.0.1:${addr.port}`,
    stop: () => server.close(),
  };
}
