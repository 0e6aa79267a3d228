// Upload benchmark (DESIGN §8): a 1 GB generated video goes through POST /api/builds/:id/media
// (multipart, streamed, signed-in session) into the fake S3, while the server process's resident
// memory is sampled from /proc; in the same run the same file goes straight to the fake S3 with
// a multipart Upload. Prints both throughputs, their ratio (target ≥ 50 %) and the server's peak
// RSS (target < 300 MB). Run: npm run bench:upload (BENCH_UPLOAD_MB changes the size).
// Processes: this one (the clients), a child running the fake S3, a child running the server.
import { fork, type ChildProcess } from 'node:child_process';
import { createHash, randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import http from 'node:http';
import path from 'node:path';
import { once } from 'node:events';
import { fileURLToPath } from 'node:url';
import type { AddressInfo } from 'node:net';
import pg from 'pg';

const SIZE_MB = Number(process.env.BENCH_UPLOAD_MB ?? 1024);
const TARGET_RATIO = 0.5;
const TARGET_RSS_MB = 300;
const BUCKET = 'bayslate-bench';
const here = fileURLToPath(import.meta.url);

// ---------- child: the fake S3 ----------
async function serveS3(dir: string) {
  const { startFakeS3 } = await import('../../server/storage/localS3');
  const s3 = await startFakeS3({ directory: dir, bucket: BUCKET });
  process.send!({ endpoint: s3.endpoint });
  process.on('disconnect', () => process.exit(0));
}

// ---------- child: the Bayslate server ----------
async function serveApp() {
  const { createApp } = await import('../../server/app');
  const app = createApp();
  const server = app.listen(0, '127.0.0.1', () => process.send!({ port: (server.address() as AddressInfo).port }));
  process.on('disconnect', () => process.exit(0));
}

function child(
  args: string[],
  env: NodeJS.ProcessEnv,
): Promise<{ proc: ChildProcess; msg: Record<string, string | number> }> {
  const proc = fork(here, args, {
    env,
    execArgv: ['--import', 'tsx', '--no-warnings'],
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  return new Promise((resolve, reject) => {
    proc.once('message', (msg: Record<string, string | number>) => resolve({ proc, msg }));
    proc.once('exit', (code) => reject(new Error(`${args[0]} exited with ${code}`)));
  });
}

/** Writes `mb` MiB to disk chunk by chunk (never the whole file in memory): an MP4 by its header. */
async function generateVideo(file: string, mb: number): Promise<string> {
  const hash = createHash('sha256');
  const out = createWriteStream(file);
  const chunk = randomBytes(1024 * 1024);
  for (let i = 0; i < mb; i++) {
    const c = Buffer.from(chunk);
    c.writeUInt32BE(i, 64); // every MiB differs a little
    if (i === 0) Buffer.from('000000186674797069736f6d0000020069736f6d69736f32', 'hex').copy(c, 0); // ftyp isom
    hash.update(c);
    if (!out.write(c)) await once(out, 'drain');
  }
  out.end();
  await once(out, 'finish');
  return hash.digest('hex');
}

/** Resident memory of a process, from /proc (Linux), in MiB. */
function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Number(m[1]) / 1024 : NaN;
}

/** Streams the file as multipart/form-data with a known length, like a browser's form upload. */
function uploadThroughApi(
  url: URL,
  cookie: string,
  file: string,
  fields: Record<string, string>,
): Promise<{ status: number; body: string }> {
  const boundary = `----bayslate-bench-${randomBytes(8).toString('hex')}`;
  let head = '';
  for (const [k, v] of Object.entries(fields))
    head += `--${boundary}\r\nContent-Disposition: form-data; name="${k}"\r\n\r\n${v}\r\n`;
  head += `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="bench-1gb.mp4"\r\nContent-Type: video/mp4\r\n\r\n`;
  const tail = `\r\n--${boundary}--\r\n`;
  const length = Buffer.byteLength(head) + statSync(file).size + Buffer.byteLength(tail);
  return new Promise((resolve, reject) => {
    const req = http.request(url, {
      method: 'POST',
      headers: {
        'Content-Type': `multipart/form-data; boundary=${boundary}`,
        'Content-Length': length,
        cookie,
        'X-Requested-With': 'Bayslate',
      },
    });
    req.on('response', (res) => {
      let body = '';
      res.on('data', (c) => (body += c));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }));
    });
    req.on('error', reject);
    req.write(head);
    const src = createReadStream(file, { highWaterMark: 1024 * 1024 });
    src.on('error', reject);
    src.pipe(req, { end: false });
    src.on('end', () => req.end(tail));
  });
}

async function main() {
  const baseUrl = process.env.DATABASE_URL;
  if (!baseUrl) throw new Error('DATABASE_URL is not set: run through `npm run bench:upload`');
  const work = mkdtempSync(path.join(path.resolve('.data'), 'bench-upload-'));
  const dbName = `bench_upload_${randomBytes(4).toString('hex')}`;
  const admin = new URL(baseUrl);
  admin.pathname = '/postgres';
  const adminClient = new pg.Client({ connectionString: admin.toString() });
  await adminClient.connect();
  await adminClient.query(`CREATE DATABASE ${dbName}`);
  const dbUrl = new URL(baseUrl);
  dbUrl.pathname = `/${dbName}`;
  const children: ChildProcess[] = [];
  try {
    const file = path.join(work, 'bench-video.mp4');
    const t0 = performance.now();
    const sha = await generateVideo(file, SIZE_MB);
    console.log(`generated ${SIZE_MB} MiB test video in ${((performance.now() - t0) / 1000).toFixed(1)} s (${work})`);

    const s3 = await child(['--s3', path.join(work, 's3')], process.env);
    children.push(s3.proc);
    const endpoint = String(s3.msg.endpoint);
    const env = {
      ...process.env,
      DATABASE_URL: dbUrl.toString(),
      NODE_ENV: 'production',
      // The demo people sign in in demo mode only (the benchmark signs in as the demo installer).
      BAYSLATE_DEMO: '1',
      SERVE_CLIENT: '0',
      MAIL_WORKER: '0',
      S3_ENDPOINT: endpoint,
      S3_BUCKET: BUCKET,
      UPLOAD_DIR: path.join(work, 'uploads'),
      SMTP_URL: process.env.SMTP_URL ?? 'smtp://127.0.0.1:9',
    };
    Object.assign(process.env, env);
    const { migrate } = await import('../../server/db/migrate');
    const { sequelize, Build } = await import('../../server/models');
    await migrate();
    const { up: seedUsers } = await import('../../server/db/seeders/0001-demo-users');
    await seedUsers({ context: { sequelize, queryInterface: sequelize.getQueryInterface() } });
    const build = await Build.create({
      slug: 'bench-upload',
      name: 'Upload benchmark',
      year: 2019,
      make: 'Halvorsen',
      model: 'Tern',
      vin: null,
      mileage: null,
      budgetCents: null,
      labourRateCents: null,
      campaign: null,
      summary: null,
    });

    const app = await child(['--serve'], env);
    children.push(app.proc);
    const base = `http://127.0.0.1:${app.msg.port}`;
    const login = await fetch(`${base}/api/auth/login`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', 'X-Requested-With': 'Bayslate' },
      body: JSON.stringify({ email: 'installer@cedar-ridge.test', password: 'bayslate-demo' }),
    });
    if (!login.ok) throw new Error(`sign-in answered ${login.status}`);
    const cookie = login.headers
      .getSetCookie()
      .map((c) => c.split(';')[0])
      .join('; ');

    // 1) Direct multipart upload of the same file to the fake S3 (the reference).
    const { configureStorage, putFile, removeObject } = await import('../../server/storage');
    configureStorage({ endpoint, bucket: BUCKET });
    let t = performance.now();
    await putFile('bench/direct.mp4', file, 'video/mp4');
    const directS = (performance.now() - t) / 1000;
    await removeObject('bench/direct.mp4');

    // 2) Through the API, sampling the server's memory every 50 ms.
    const pid = app.proc.pid!;
    const idleRss = rssMb(pid);
    let peak = idleRss;
    const sampler = setInterval(() => {
      try {
        peak = Math.max(peak, rssMb(pid));
      } catch {
        /* exited */
      }
    }, 50);
    t = performance.now();
    const res = await uploadThroughApi(new URL(`${base}/api/builds/${build.id}/media`), cookie, file, {
      stage: 'during',
      caption: 'Benchmark take',
    });
    const apiS = (performance.now() - t) / 1000;
    clearInterval(sampler);
    peak = Math.max(peak, rssMb(pid));
    if (res.status !== 201) throw new Error(`the API answered ${res.status}: ${res.body.slice(0, 300)}`);
    const media = JSON.parse(res.body).media as { sha256: string; sizeBytes: number };
    if (media.sha256 !== sha || media.sizeBytes !== SIZE_MB * 1024 * 1024)
      throw new Error('the stored upload does not match the file');

    const mbps = (s: number) => SIZE_MB / s;
    const ratio = mbps(apiS) / mbps(directS);
    console.log(`\nfile: ${SIZE_MB} MiB, loopback, fake S3 (s3rver) in its own process`);
    console.log(
      `direct multipart Upload to S3:   ${mbps(directS).toFixed(1).padStart(7)} MiB/s  (${directS.toFixed(1)} s)`,
    );
    console.log(`through POST /media (API):       ${mbps(apiS).toFixed(1).padStart(7)} MiB/s  (${apiS.toFixed(1)} s)`);
    console.log(`throughput ratio: ${(ratio * 100).toFixed(1)} % (target ≥ ${TARGET_RATIO * 100} %)`);
    console.log(`server RSS: idle ${idleRss.toFixed(0)} MB, peak ${peak.toFixed(0)} MB (target < ${TARGET_RSS_MB} MB)`);
    console.log(`sha256 of the stored upload matches the file: yes`);
    const met = ratio >= TARGET_RATIO && peak < TARGET_RSS_MB;
    console.log(met ? 'targets met' : 'targets NOT met');
    process.exitCode = met ? 0 : 1;
    await sequelize.close();
  } finally {
    for (const c of children.reverse()) {
      if (c.exitCode === null) {
        const exited = new Promise((r) => c.once('exit', r));
        c.kill('SIGTERM');
        await exited;
      }
    }
    await adminClient.query(`DROP DATABASE IF EXISTS ${dbName} WITH (FORCE)`);
    await adminClient.end();
    rmSync(work, { recursive: true, force: true });
  }
}

if (process.argv.includes('--s3')) {
  serveS3(process.argv[process.argv.indexOf('--s3') + 1]).catch((err) => {
    console.error(err);
    process.exit(1);
  });
} else if (process.argv.includes('--serve')) {
  serveApp().catch((err) => {
    console.error(err);
    process.exit(1);
  });
} else if (process.argv[1] && here === process.argv[1]) {
  mkdirSync('.data', { recursive: true });
  main().catch((err) => {
    console.error('[bench:upload]', err?.message ?? err);
    process.exitCode = 1;
  });
}
