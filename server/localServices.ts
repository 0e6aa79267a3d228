// Local stand-ins started inside the server process when no real service is configured:
// a fake S3 (when S3_ENDPOINT is unset) and a fake SMTP server (when SMTP_URL is unset).
// Storage and mail adapters register their starters here.
type Starter = { name: string; start: () => Promise<void>; stop: () => Promise<void> };
const starters: Starter[] = [];

export function registerLocalService(s: Starter) {
  starters.push(s);
}

export async function startLocalServices() {
  for (const s of starters) await s.start();
}

export async function stopLocalServices() {
  for (const s of [...starters].reverse()) await s.stop().catch(() => undefined);
}
