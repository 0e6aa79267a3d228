// The health-check registry: adapters (storage, mail) register a check at start-up, and the
// health routes (routes/health.ts) run them. It lives outside routes/ so an adapter never imports
// a route.

export type HealthCheck = () => Promise<boolean>;
const checks = new Map<string, HealthCheck>();

/** Adapters call this at start-up so /api/health/ready reports them. */
export function registerHealthCheck(name: string, check: HealthCheck) {
  checks.set(name, check);
}

/** Every registered check by name, in the order they were registered. */
export function healthChecks(): ReadonlyMap<string, HealthCheck> {
  return checks;
}
