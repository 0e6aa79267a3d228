// The local fake S3 (s3rver) on loopback: `npm start` runs it in a process of its own
// (scripts/fake-service.ts); the tests and scripts start it with startFakeS3. Never in the server.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import S3rver from 's3rver';
import { config } from '../config';
import { configureStorage } from './s3';

export interface FakeS3 {
  endpoint: string;
  port: number;
  stop: () => Promise<void>;
}

/** Starts s3rver on 127.0.0.1 (port 0 = any free port) with the bucket created. */
export async function startFakeS3(opts: { directory: string; bucket: string; port?: number }): Promise<FakeS3> {
  mkdirSync(opts.directory, { recursive: true });
  const server = new S3rver({
    port: opts.port ?? 0,
    address: '127.0.0.1',
    directory: opts.directory,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [] }],
  });
  const addr = (await server.run()) as { port: number };
  const http = (server as unknown as { httpServer?: { closeAllConnections?: () => void } }).httpServer;
  return {
    // 127.0.0.1, not the bind host: presigned URLs must open in the person's browser.
    endpoint: `http://127.0.0.1:${addr.port}`,
    port: addr.port,
    stop: async () => {
      const closing = server.close();
      // Keep-alive sockets of the SDK would hold close() open.
      http?.closeAllConnections?.();
      await closing;
    },
  };
}

let running: FakeS3 | null = null;

export async function startLocalS3() {
  const c = config();
  running = await startFakeS3({ directory: path.resolve(c.LOCAL_S3_DIR), bucket: c.S3_BUCKET, port: c.LOCAL_S3_PORT });
  configureStorage({ endpoint: running.endpoint, forcePathStyle: true });
  console.log(`[bayslate] local fake S3 on ${running.endpoint} (data in ${c.LOCAL_S3_DIR})`);
}

export async function stopLocalS3() {
  await running?.stop();
  running = null;
}
