// Types for local-fakes.mjs.
export function keepFakeRunning(
  root: string,
  kind: 's3' | 'smtp',
  env: NodeJS.ProcessEnv,
  port?: number,
): Promise<{ port: number; pid: () => number | undefined; stop: () => Promise<void> }>;
