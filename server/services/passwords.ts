// Password hashing, on its own so that users.ts and invitations.ts can both use it without
// importing each other (an import cycle).
import bcrypt from 'bcryptjs';
import { config } from '../config';

/** A bcrypt hash at the configured cost (PASSWORD_HASH_COST, 10 unless set). */
export const hashPassword = (plain: string) => bcrypt.hash(plain, config().PASSWORD_HASH_COST);
