// `npm run create-owner`: makes the first owner outside demo mode (BAYSLATE_DEMO=0), asking for
// e-mail, name and password on the terminal (or OWNER_EMAIL / OWNER_NAME / OWNER_PASSWORD).
import readline from 'node:readline/promises';
import { migrate } from '../server/db/migrate';
import { createUser } from '../server/services/users';
import { sequelize } from '../server/models';
import { createUserSchema } from '../shared/schemas/auth';

async function ask(rl: readline.Interface, question: string, fallback: string | undefined) {
  if (fallback) return fallback;
  return (await rl.question(question)).trim();
}

const rl = readline.createInterface({ input: process.stdin, output: process.stdout });
try {
  await migrate();
  const args = process.argv.slice(2);
  const input = {
    email: await ask(rl, 'E-mail: ', args[0]),
    name: await ask(rl, 'Name: ', args[1]),
    password: await ask(rl, 'Password (8+ characters): ', args[2]),
    roles: ['owner'],
  };
  const parsed = createUserSchema.safeParse(input);
  if (!parsed.success) {
    for (const i of parsed.error.issues) console.error(`  ${i.path.join('.')}: ${i.message}`);
    process.exitCode = 1;
  } else {
    const { user } = await createUser(null, parsed.data);
    console.log(`[bayslate] owner ${user.email} created; sign in at the app's URL.`);
  }
} catch (err) {
  console.error(`[bayslate] ${(err as Error).message}`);
  process.exitCode = 1;
} finally {
  rl.close();
  await sequelize.close();
}
