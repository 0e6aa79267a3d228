// The local fake S3 and SMTP for `npm start`, each in a process of its own on loopback
// (scripts/fake-service.ts). A fake that stops is started again on the same port, and the
// start says so; the server never goes down with it.
import { spawn } from 'node:child_process';
import { freePort } from './pg-cluster.mjs';
import { log } from './system.mjs';

/**
 * Starts the fake `kind` ('s3' or 'smtp') on `port` (0: a free one) and keeps it running until
 * stop(). Resolves once it listens: { port, stop }.
 */
export async function keepFakeRunning(root, kind, env, port = 0) {
  port ||= await freePort();
  const portVar = kind === 's3' ? 'LOCAL_S3_PORT' : 'LOCAL_SMTP_PORT';
  let child = null;
  let stopped = false;
  let restarts = 0;

  const launch = () =>
    new Promise((resolve, reject) => {
      const c = spawn(process.execPath, ['--import', 'tsx', 'scripts/fake-service.ts', kind], {
        cwd: root,
        env: { ...env, [portVar]: String(port) },
        stdio: ['ignore', 'pipe', 'inherit'],
      });
      child = c;
      let ready = false;
      c.stdout.on('data', (chunk) => {
        if (!ready && String(chunk).includes('ready on')) {
          ready = true;
          resolve();
        }
      });
      c.once('exit', (code, signal) => {
        if (!ready) return reject(new Error(`the local fake ${kind} did not start (exit ${code ?? signal})`));
        if (stopped) return;
        restarts += 1;
        log(
          `the local fake ${kind === 's3' ? 'S3' : 'SMTP'} stopped (${signal ?? `exit ${code}`}); starting it again on port ${port} (restart ${restarts})`,
        );
        setTimeout(() => launch().catch((err) => log(err.message)), Math.min(500 * restarts, 5000));
      });
    });

  await launch();
  return {
    port,
    pid: () => child?.pid,
    stop: () =>
      new Promise((resolve) => {
        stopped = true;
        if (!child || child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}
