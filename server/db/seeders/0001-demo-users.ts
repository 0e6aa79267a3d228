// The four demo sign-ins of Cedar Ridge Upfitters (invented people), demo mode only.
import type { MigrationContext } from '../migrate';
import { User } from '../../models';
import { hashPassword } from '../../services/passwords';

export const DEMO_PASSWORD = 'bayslate-demo';
export const DEMO_USERS = [
  { email: 'owner@cedar-ridge.test', name: 'Marta Lindqvist', roles: ['owner'] },
  { email: 'producer@cedar-ridge.test', name: 'Theo Okafor', roles: ['producer'] },
  { email: 'installer@cedar-ridge.test', name: 'Ruben Castell', roles: ['installer'] },
  { email: 'marketing@cedar-ridge.test', name: 'Ines Varga', roles: ['marketing'] },
] as const;

export async function up(_: { context: MigrationContext }) {
  const hash = await hashPassword(DEMO_PASSWORD);
  for (const u of DEMO_USERS) {
    await User.findOrCreate({ where: { email: u.email }, defaults: { ...u, roles: [...u.roles], passwordHash: hash } });
  }
}

export async function down() {}
