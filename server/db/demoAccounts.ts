// The e-mail addresses of the demo sign-ins, without the seeder (which stays out of the production
// path). tests/api/deploy-safety.test.ts checks this list against seeders/0001-demo-users.ts.
export const DEMO_EMAILS = [
  'owner@cedar-ridge.test',
  'producer@cedar-ridge.test',
  'installer@cedar-ridge.test',
  'marketing@cedar-ridge.test',
] as const;

export const isDemoEmail = (email: string) => (DEMO_EMAILS as readonly string[]).includes(email.trim().toLowerCase());
