// Object storage for media: the S3 adapter and the 'storage' health check. The local fake S3 runs
// in a process of its own (scripts/start.mjs), never inside the server.
import { registerHealthCheck } from '../health';
import { bucketReachable } from './s3';

export * from './s3';

let registered = false;

/** Called once by the media routes: registers the health check. */
export function registerStorage() {
  if (registered) return;
  registered = true;
  registerHealthCheck('storage', bucketReachable);
}
