// The compiled server (npm run build's build/server) as a child process, for tests of the
// production runtime: several instances on one database, PostgreSQL restarts, refusals at start.
// Each test file compiles its own copy under .data/ (esbuild, well under a second) so files
// running in parallel never share one.
import { spawn, execFileSync, type ChildProcess } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { freePort } from '../../scripts/lib/pg-cluster.mjs';

const root = path.resolve(import.meta.dirname, '../..');
let built: string | null = null;

/** Compiles the server once per test file; returns the folder holding index.js. */
export function buildServer(): string {
  if (built && existsSync(path.join(built, 'index.js'))) return built;
  const out = path.join(root, '.data', `build-test-${process.pid}-${randomBytes(3).toString('hex')}`, 'server');
  execFileSync(process.execPath, ['scripts/build-server.mjs', '--out', out], { cwd: root, stdio: 'pipe' });
  built = out;
  return out;
}

/** Removes this file's compiled copy (call in afterAll). */
export function removeBuild() {
  if (built) rmSync(path.dirname(built), { recursive: true, force: true });
  built = null;
}

export interface ServerProcess {
  url: string;
  port: number;
  child: ChildProcess;
  output: () => string;
  /** Resolves with the exit code once the process has ended. */
  exited: Promise<number | null>;
  stop: (signal?: NodeJS.Signals) => Promise<number | null>;
}

/** The environment a child server gets: this file's settings minus what the caller unsets. */
export function childEnv(extra: Record<string, string | undefined>): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = { ...process.env, SERVE_CLIENT: '0', LOG_REQUESTS: '0' };
  for (const [k, v] of Object.entries(extra)) {
    if (v === undefined) delete env[k];
    else env[k] = v;
  }
  return env;
}

/** Runs `node <build>/<entry>`; resolves once it says it listens, or rejects with its output if it exits first. */
export async function startServerProcess(
  extra: Record<string, string | undefined> = {},
  entry = 'index.js',
): Promise<ServerProcess> {
  const dir = buildServer();
  const port = await freePort();
  const env = childEnv({ PORT: String(port), HOST: '127.0.0.1', PUBLIC_URL: `http://127.0.0.1:${port}`, ...extra });
  const child = spawn(process.execPath, [path.join(dir, entry)], { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] });
  let out = '';
  child.stdout!.on('data', (c) => (out += c));
  child.stderr!.on('data', (c) => (out += c));
  // 'close', not 'exit': a process that has exited may still have output in its pipes, and a test
  // reads the whole output once the process is gone (Node's child_process docs on the two events).
  const exited = new Promise<number | null>((r) => child.once('close', (code) => r(code)));
  await new Promise<void>((resolve, reject) => {
    // Generous: a start takes seconds on a busy 2-core machine; a slow start is not a failure.
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${out}`)), 60_000);
    child.stdout!.on('data', () => out.includes('server listening') && (clearTimeout(timer), resolve()));
    void exited.then((code) => (clearTimeout(timer), reject(new Error(`server exited ${code}:\n${out}`))));
  });
  return {
    url: `http://127.0.0.1:${port}`,
    port,
    child,
    output: () => out,
    exited,
    stop: (signal = 'SIGTERM') => {
      if (child.exitCode === null) child.kill(signal);
      const hard = setTimeout(() => child.kill('SIGKILL'), 8000);
      return exited.finally(() => clearTimeout(hard));
    },
  };
}

/** Runs `node <build>/<entry>` to its end (for starts that must refuse): exit code and output. */
export function runServerToEnd(
  extra: Record<string, string | undefined>,
  entry = 'index.js',
  args: string[] = [],
): Promise<{ code: number | null; output: string }> {
  const dir = buildServer();
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [path.join(dir, entry), ...args], {
      cwd: root,
      env: childEnv({ HOST: '127.0.0.1', PORT: '0', ...extra }),
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let out = '';
    child.stdout!.on('data', (c) => (out += c));
    child.stderr!.on('data', (c) => (out += c));
    const timer = setTimeout(() => child.kill('SIGKILL'), 60_000);
    child.once('close', (code) => (clearTimeout(timer), resolve({ code, output: out })));
  });
}

/** A tiny cookie-keeping client for a server on its own port (fetch; the cookie can be shared). */
export class Client {
  cookie = '';
  constructor(public base: string) {}
  async req(method: string, p: string, body?: unknown) {
    const res = await fetch(this.base + p, {
      method,
      headers: {
        'X-Requested-With': 'Bayslate',
        ...(body ? { 'Content-Type': 'application/json' } : {}),
        ...(this.cookie ? { Cookie: this.cookie } : {}),
      },
      body: body ? JSON.stringify(body) : undefined,
    });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('bayslate.sid='));
    if (set) this.cookie = set.split(';')[0];
    const text = await res.text();
    let json: any = null;
    try {
      json = JSON.parse(text);
    } catch {
      json = null;
    }
    return { status: res.status, body: json, text, headers: res.headers };
  }
  get = (p: string) => this.req('GET', p);
  post = (p: string, body: unknown) => this.req('POST', p, body);
  patch = (p: string, body: unknown) => this.req('PATCH', p, body);
  /** The same session on another instance. */
  on(base: string) {
    const c = new Client(base);
    c.cookie = this.cookie;
    return c;
  }
}
