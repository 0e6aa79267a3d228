// The signed-in person as last seen online, so the shop floor opens without the network after a
// reload. Only names and roles (no secret): every request still needs the session cookie, and the
// server decides. Forgotten on sign-out.
import type { SessionUser } from '@shared/schemas/auth';

const KEY = 'bayslate.offlineUser';

export function rememberUser(user: SessionUser) {
  try {
    localStorage.setItem(KEY, JSON.stringify({ id: user.id, email: user.email, name: user.name, roles: user.roles }));
  } catch {
    /* storage full or blocked: offline reloads then ask to sign in */
  }
}

export function rememberedUser(): SessionUser | null {
  try {
    const raw = localStorage.getItem(KEY);
    return raw ? (JSON.parse(raw) as SessionUser) : null;
  } catch {
    return null;
  }
}

export function forgetUser() {
  try {
    localStorage.removeItem(KEY);
  } catch {
    /* nothing to forget */
  }
}
