// Object storage for media: the S3 adapter and the 'storage' health check. The local fake S3 runs
// in a process of its own (scripts/start.mjs), never inside the server.
// eslint-disable-next-line import-x/no-restricted-paths -- issue 13: the health-check registry belongs outside routes/
import { registerHealthCheck } from '../routes/health';
import { bucketReachable } from './s3';

export * from './s3';

let registered = false;

/** Called once by the media routes: registers the health check. */
export function registerStorage() {
  if (registered) return;
  registered = true;
  registerHealthCheck('storage', bucketReachable);
}
