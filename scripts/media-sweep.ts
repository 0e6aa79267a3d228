// `npm run media:sweep [-- --remove] [-- --grace-minutes N]`: lists objects in storage that no
// media row names (and temporary upload files a crash left), and removes them with --remove.
// Uses the configured store, or the local fake S3's data folder when S3_ENDPOINT is unset.
import { sweepOrphans, sweepTempFiles } from '../server/services/mediaSweep';
import { usesLocalFake } from '../server/storage';
import { startLocalS3, stopLocalS3 } from '../server/storage/localS3';
import { sequelize } from '../server/models';

const args = process.argv.slice(2);
const remove = args.includes('--remove');
const g = args.indexOf('--grace-minutes');
const graceMs = g >= 0 ? Number(args[g + 1]) * 60_000 : undefined;

if (usesLocalFake()) await startLocalS3();
try {
  const r = await sweepOrphans({ remove, graceMs });
  for (const o of r.orphans) console.log(`${remove ? 'removed' : 'leftover'}  ${o.key}  (${o.size} bytes)`);
  const temp = await sweepTempFiles({ remove, graceMs });
  for (const f of temp) console.log(`${remove ? 'removed' : 'leftover'}  ${f}  (temporary upload file)`);
  console.log(
    `[media:sweep] ${temp.length} temporary upload files older than the grace period${remove ? ' removed' : ''}.`,
  );
  console.log(
    `[media:sweep] ${r.scanned} objects scanned, ${r.orphans.length} without a media row${remove ? `, ${r.removed} removed` : r.orphans.length ? ' — run with --remove to delete them' : ''}.`,
  );
} finally {
  if (usesLocalFake()) await stopLocalS3();
  await sequelize.close();
}
