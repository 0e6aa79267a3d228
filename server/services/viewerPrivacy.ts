// Keeping viewers' e-mail addresses out of the database until they confirm: a keyed hash to
// count one vote per person, the address sealed with a key only the confirmation link carries,
// single-use tokens stored as hashes, and self-verifying unsubscribe tokens.
import {
  createCipheriv,
  createDecipheriv,
  createHash,
  createHmac,
  hkdfSync,
  randomBytes,
  timingSafeEqual,
} from 'node:crypto';
import { config } from '../config';

// Keys come from VIEWER_KEY_SECRET alone, one per purpose (HKDF-SHA-256, RFC 5869, with the
// purpose as its info label), so rotating the session secret never touches viewers' hashes or links.
const derived = new Map<string, Buffer>();
export function viewerKey(purpose: 'email-hash' | 'unsubscribe'): Buffer {
  const secret = config().viewerKeySecret;
  const id = `${purpose}\n${secret}`;
  let k = derived.get(id);
  if (!k) {
    k = Buffer.from(hkdfSync('sha256', secret, 'bayslate-viewer-keys', `bayslate/${purpose}`, 32));
    derived.set(id, k);
  }
  return k;
}

// Before VIEWER_KEY_SECRET, keys were derived from the session secret. Migration 0014 moves the
// stored hashes to the new key; links already mailed (unsubscribe) keep working through these.
const legacyKey = (purpose: string) =>
  createHash('sha256').update(`bayslate:${purpose}:${config().SESSION_SECRET}`).digest();

export const normaliseEmail = (email: string) => email.trim().toLowerCase();

/** The person behind an address: case and spaces aside, and without a "+tag" sub-address. */
export function personOfEmail(email: string) {
  const address = normaliseEmail(email);
  const at = address.lastIndexOf('@');
  if (at < 1) return address;
  const local = address.slice(0, at).split('+')[0] || address.slice(0, at);
  return `${local}${address.slice(at)}`;
}

/** Keyed hash of the person an address names (64 hex): equal for name+1@ and NAME@, useless without the server key. */
export const emailHash = (email: string) =>
  createHmac('sha256', viewerKey('email-hash')).update(personOfEmail(email)).digest('hex');
/** The hash the same address had under the session-secret key (migration 0014 and old links). */
export const legacyEmailHash = (email: string) =>
  createHmac('sha256', legacyKey('email')).update(normaliseEmail(email)).digest('hex');

/** A fresh single-use token (URL-safe, 256 bits) and the hash we store instead of it. */
export function newToken() {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: tokenHash(token) };
}
export const tokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

// AES-256-GCM with a key derived from the token: the address can only be read back with the link.
export function sealEmail(email: string, token: string): string {
  const iv = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', createHash('sha256').update(`seal:${token}`).digest(), iv);
  const data = Buffer.concat([cipher.update(normaliseEmail(email), 'utf8'), cipher.final()]);
  return [iv, cipher.getAuthTag(), data].map((b) => b.toString('base64url')).join('.');
}
export function unsealEmail(sealed: string, token: string): string | null {
  try {
    const [iv, tag, data] = sealed.split('.').map((p) => Buffer.from(p, 'base64url'));
    const decipher = createDecipheriv('aes-256-gcm', createHash('sha256').update(`seal:${token}`).digest(), iv!);
    decipher.setAuthTag(tag!);
    return Buffer.concat([decipher.update(data!), decipher.final()]).toString('utf8');
  } catch {
    return null;
  }
}

const unsubSig = (hash: string) =>
  createHmac('sha256', viewerKey('unsubscribe')).update(hash).digest('hex').slice(0, 32);
const legacyUnsubSig = (hash: string) =>
  createHmac('sha256', legacyKey('unsubscribe')).update(hash).digest('hex').slice(0, 32);

/** The token of an unsubscribe link: the address hash and a signature over it. */
export const unsubscribeToken = (hash: string) => `${hash}.${unsubSig(hash)}`;

/** The address hash an unsubscribe token names, or null when it is not one of ours. */
export function readUnsubscribeToken(token: string): string | null {
  const m = /^([0-9a-f]{64})\.([0-9a-f]{32})$/.exec(token);
  if (!m) return null;
  const given = Buffer.from(m[2]!);
  // A link mailed before the key change names the old hash; the database maps it to the new one
  // when it is recorded (migration 0014).
  const ok =
    timingSafeEqual(Buffer.from(unsubSig(m[1]!)), given) || timingSafeEqual(Buffer.from(legacyUnsubSig(m[1]!)), given);
  return ok ? m[1]! : null;
}
