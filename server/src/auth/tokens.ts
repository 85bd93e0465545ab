import { createHash, createHmac, randomBytes } from 'node:crypto';
import { chmodSync, existsSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { errors, jwtVerify, SignJWT } from 'jose';
import { ROLES, type Role } from '@counterpoise/api';

/** The only algorithm an access token may use; verification refuses any other (`none` included). */
export const ACCESS_TOKEN_ALGORITHM = 'HS256';
/** How long an access token is good for. */
export const ACCESS_TOKEN_TTL_SECONDS = 600;
const ISSUER = 'counterpoise';
const AUDIENCE = 'counterpoise-workbench';

/** The file, beside the database, that keeps the signing key generated on the first start. */
export const SIGNING_KEY_FILE = 'auth-signing-key';

/**
 * The key that signs access tokens: `AUTH_SIGNING_KEY` when set, otherwise the one in
 * `<dataDir>/auth-signing-key`, generated (48 random bytes, readable by its owner only) the first time.
 * Keeping it on disk lets tokens survive a restart.
 */
export function loadSigningKey(configured: string | undefined, dataDir: string): Uint8Array {
  if (configured !== undefined) return new TextEncoder().encode(configured);
  const file = join(dataDir, SIGNING_KEY_FILE);
  if (!existsSync(file)) {
    writeFileSync(file, `${randomBytes(48).toString('base64url')}\n`, { mode: 0o600, flag: 'wx' });
  }
  chmodSync(file, 0o600);
  return new TextEncoder().encode(readFileSync(file, 'utf8').trim());
}

/** Who an access token speaks for. The role is read again from the database on each request. */
export interface AccessClaims {
  readonly userId: number;
  readonly organisationId: number;
  readonly role: Role;
}

/** Signs a short-lived access token with the claims `sub`, `org` and `role`. */
export async function signAccessToken(claims: AccessClaims, key: Uint8Array, now: Date): Promise<string> {
  const issuedAt = Math.floor(now.getTime() / 1000);
  return new SignJWT({ org: claims.organisationId, role: claims.role })
    .setProtectedHeader({ alg: ACCESS_TOKEN_ALGORITHM, typ: 'JWT' })
    .setSubject(String(claims.userId))
    .setIssuer(ISSUER)
    .setAudience(AUDIENCE)
    .setIssuedAt(issuedAt)
    .setExpirationTime(issuedAt + ACCESS_TOKEN_TTL_SECONDS)
    .sign(key);
}

/** Why an access token was refused. */
export type TokenRefusal = 'expired' | 'invalid';

/**
 * Verifies an access token: signature with the pinned algorithm, issuer, audience and expiry (against
 * the app's clock), and claims of the expected shape.
 */
export async function verifyAccessToken(
  token: string,
  key: Uint8Array,
  now: Date,
): Promise<AccessClaims | TokenRefusal> {
  try {
    const { payload } = await jwtVerify(token, key, {
      algorithms: [ACCESS_TOKEN_ALGORITHM],
      issuer: ISSUER,
      audience: AUDIENCE,
      currentDate: now,
      requiredClaims: ['sub', 'exp', 'iat'],
    });
    const userId = Number(payload.sub);
    const organisationId = payload['org'];
    const role = payload['role'];
    if (
      !Number.isSafeInteger(userId) ||
      userId <= 0 ||
      typeof organisationId !== 'number' ||
      !Number.isSafeInteger(organisationId) ||
      !ROLES.includes(role as Role)
    ) {
      return 'invalid';
    }
    return { userId, organisationId, role: role as Role };
  } catch (error) {
    return error instanceof errors.JWTExpired ? 'expired' : 'invalid';
  }
}

/** Whether a bearer value has the shape of a JWT (three base64url parts), as opposed to an API key. */
export function looksLikeJwt(value: string): boolean {
  return /^[A-Za-z0-9_-]+\.[A-Za-z0-9_-]+\.[A-Za-z0-9_-]*$/.test(value);
}

/** A random single-use secret (refresh token, invitation or reset link): 32 bytes in base64url. */
export function generateSecret(): { secret: string; hash: string } {
  const secret = randomBytes(32).toString('base64url');
  return { secret, hash: hashSecret(secret) };
}

/** The stored form of a random secret: SHA-256 in hex (as for API keys, a fast hash suffices). */
export function hashSecret(secret: string): string {
  return createHash('sha256').update(secret).digest('hex');
}

/**
 * A key of its own for one purpose (`purpose` names it), derived from the signing key with HMAC-SHA256,
 * so that a token signed for one purpose can never be taken for another's, even if a check were missed.
 */
export function deriveSigningKey(key: Uint8Array, purpose: string): Uint8Array {
  return new Uint8Array(createHmac('sha256', key).update(`counterpoise:${purpose}`).digest());
}
