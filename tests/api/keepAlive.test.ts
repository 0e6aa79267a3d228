// What was seen (13): under heavy load a browser journey's own API read failed with "socket hang up
// (ECONNRESET)". Node's server closed an idle kept-alive connection after its default 5 s at the
// moment the client (whose own idle limit is also 5 s in Node 20) sent the next request on it. The
// server now keeps idle connections open longer than any usual client or proxy keeps them
// (KEEP_ALIVE_TIMEOUT_MS, 65 s by default: longer than a load balancer's common 60 s idle limit,
// common practice), so the client is always the side that closes an idle connection.
import http from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { removeBuild, startServerProcess, type ServerProcess } from '../helpers/server-process';
import { Live } from '../../shared/contracts/health';

let server: ServerProcess;

beforeAll(async () => {
  server = await startServerProcess({ NODE_ENV: 'test', BAYSLATE_DEMO: '0', MAIL_WORKER: '0' });
});
afterAll(async () => {
  await server?.stop();
  removeBuild();
});

/** GET through `agent`; resolves with the status, the parsed body and the client port of the connection used. */
function get(agent: http.Agent, path: string) {
  return new Promise<{ status: number; body: unknown; localPort: number }>((resolve, reject) => {
    const req = http.get(`${server.url}${path}`, { agent }, (res) => {
      let text = '';
      res.setEncoding('utf8');
      res.on('data', (c) => (text += c));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, body: JSON.parse(text), localPort: req.socket?.localPort ?? -1 }),
      );
    });
    req.on('error', reject);
  });
}

/** Waits until the agent's one idle socket is back in its free list (the response has been read). */
async function idleSocket(agent: http.Agent) {
  for (let i = 0; i < 200 && !Object.values(agent.freeSockets).flat().length; i++)
    await new Promise((r) => setTimeout(r, 5));
  return Object.values(agent.freeSockets).flat()[0];
}

describe('kept-alive connections', () => {
  it('stay open while a client leaves them idle past 5 s, so reusing one never meets a closing socket', async () => {
    // A client that keeps idle connections for 30 s (a proxy or a long-lived API client).
    const agent = new http.Agent({ keepAlive: true, maxSockets: 1, timeout: 30_000 });
    try {
      const first = await get(agent, '/api/health/live');
      expect(first.status).toBe(200);
      Live.parse(first.body);
      const socket = await idleSocket(agent);
      expect(socket, 'the first connection is kept for reuse').toBeDefined();
      let closedByServer = false;
      socket!.once('close', () => (closedByServer = true));
      // Idle past Node's 5 s default.
      await new Promise((r) => setTimeout(r, 6_000));
      expect(closedByServer, 'the server closed the idle connection').toBe(false);
      const second = await get(agent, '/api/health/live');
      expect(second.status).toBe(200);
      expect(second.localPort, 'the second request reused the first connection').toBe(first.localPort);
    } finally {
      agent.destroy();
    }
  }, 90_000);
});
