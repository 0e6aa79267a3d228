// Password hashing, on its own so that users.ts and invitations.ts can both use it without
// importing each other (an import cycle).
import bcrypt from 'bcryptjs';

export const hashPassword = (plain: string) => bcrypt.hash(plain, 10);
