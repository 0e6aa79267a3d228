// Object storage for media: the S3 adapter, the local fake registered for `npm start`
// (S3_ENDPOINT unset), and the 'storage' health check.
import { registerLocalService } from '../localServices';
// eslint-disable-next-line import-x/no-restricted-paths -- issue 13: the health-check registry belongs outside routes/ (routes/health.ts owner to move it)
import { registerHealthCheck } from '../routes/health';
import { bucketReachable, usesLocalFake } from './s3';
import { startLocalS3, stopLocalS3 } from './localS3';

export * from './s3';

let registered = false;

/** Called once by the media routes: registers the local fake (if needed) and the health check. */
export function registerStorage() {
  if (registered) return;
  registered = true;
  if (usesLocalFake()) registerLocalService({ name: 'fake S3', start: startLocalS3, stop: stopLocalS3 });
  registerHealthCheck('storage', bucketReachable);
}
