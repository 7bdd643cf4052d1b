/**
 * A real S3-compatible server for tests (s3rver, files in a temporary folder) on a free port of 127.0.0.1,
 * with the variables the AWS SDK reads to reach it. Each call gets its own folder and bucket.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';

export interface LocalS3 {
  bucket: string;
  /** CAPTURE_STORE and the SDK's endpoint and credential variables for this server. */
  env: Record<string, string>;
  /** The folder s3rver keeps objects in. */
  dir: string;
  close(): Promise<void>;
}

export async function startLocalS3(bucket = 'crankprint-test', prefix = 'captures'): Promise<LocalS3> {
  const dir = mkdtempSync(join(tmpdir(), 'crankprint-s3-'));
  const server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: bucket }] });
  const { port } = await server.run();
  return {
    bucket,
    dir,
    env: {
      CAPTURE_STORE: `s3://${bucket}/${prefix}`,
      AWS_ENDPOINT_URL_S3: `http://127.0.0.1:${port}`,
      AWS_REGION: 'us-east-1',
      // s3rver's documented development credentials.
      AWS_ACCESS_KEY_ID: 'S3RVER',
      AWS_SECRET_ACCESS_KEY: 'S3RVER',
    },
    async close() {
      await server.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
