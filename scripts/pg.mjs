// `node scripts/pg.mjs start|stop|url`: the project's private development cluster by hand.
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { startCluster } from './lib/pg-cluster.mjs';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const home = path.join(root, '.data', 'pg');
const port = Number(process.env.BAYSLATE_PG_PORT ?? 54329);
const cmd = process.argv[2] ?? 'start';
const cluster = await startCluster({ home, port });
if (cmd === 'stop') cluster.stop();
else console.log(cluster.url);
