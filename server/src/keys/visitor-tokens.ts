import { randomBytes } from 'node:crypto';
import { decodeProtectedHeader, errors, jwtVerify, SignJWT } from 'jose';
import { DEFAULT_VISITOR_TOKEN_SECONDS, MAX_VISITOR_TOKEN_SECONDS } from '@counterpoise/api';
import { ACCESS_TOKEN_ALGORITHM, deriveSigningKey } from '../auth/tokens';
import type { Clock } from '../clock';

/**
 * The `typ` of a visitor token's header, which tells it from a person's access token before any
 * verification (both travel as `Authorization: Bearer`); the audience and the signing key differ too.
 */
export const VISITOR_TOKEN_TYPE = 'cp-visitor+jwt';
const ISSUER = 'counterpoise';
const AUDIENCE = 'counterpoise-calc';

/** What a verified visitor token says. */
export interface VisitorClaims {
  /** The key the token was exchanged for: its usage, limit and revocation count. */
  readonly keyId: number;
  /** The only web origin the token may be used from, when it is bound to one. */
  readonly origin?: string;
  /** The portal's own id of the visitor, when it gave one. */
  readonly visitor?: string;
  readonly expiresAt: Date;
}

/** Why a visitor token was refused. */
export type VisitorTokenRefusal = 'expired' | 'invalid';

/** Origins of live tokens remembered for preflights; past this the expired ones are dropped first. */
const MAX_TOKEN_ORIGINS = 10_000;

/**
 * Short-lived tokens a portal's back end gets for one visitor in exchange for its secret key (HS256 with
 * jose, signed with a key derived from the app's signing key). A token names its key by id, and
 * optionally a web origin and the visitor; it lives at most `MAX_VISITOR_TOKEN_SECONDS`.
 *
 * The origins of live tokens are remembered in this process, so that a browser's preflight from such an
 * origin (which carries no token) is answered; the server is one process over one SQLite file.
 */
export class VisitorTokens {
  private readonly key: Uint8Array;
  /** Web origin → when its last token ends (ms since the epoch). */
  private readonly liveOrigins = new Map<string, number>();

  constructor(
    signingKey: Uint8Array,
    private readonly clock: Clock,
  ) {
    this.key = deriveSigningKey(signingKey, 'visitor-token');
  }

  /** Signs a token for one visitor of the key `keyId`. */
  async issue(
    keyId: number,
    options: { origin?: string; visitor?: string; ttlSeconds?: number },
  ): Promise<{ token: string; expiresAt: Date }> {
    const ttl = Math.min(options.ttlSeconds ?? DEFAULT_VISITOR_TOKEN_SECONDS, MAX_VISITOR_TOKEN_SECONDS);
    const issuedAt = Math.floor(this.clock.now().getTime() / 1000);
    const expiresAt = new Date((issuedAt + ttl) * 1000);
    const jwt = new SignJWT({ key: keyId, ...(options.origin ? { origin: options.origin } : {}) })
      .setProtectedHeader({ alg: ACCESS_TOKEN_ALGORITHM, typ: VISITOR_TOKEN_TYPE })
      .setIssuer(ISSUER)
      .setAudience(AUDIENCE)
      .setIssuedAt(issuedAt)
      .setExpirationTime(issuedAt + ttl)
      .setJti(randomBytes(9).toString('base64url'));
    if (options.visitor !== undefined) jwt.setSubject(options.visitor);
    const token = await jwt.sign(this.key);
    if (options.origin) this.rememberOrigin(options.origin, expiresAt.getTime());
    return { token, expiresAt };
  }

  /**
   * Verifies a token: signature with the pinned algorithm and this purpose's key, type, issuer,
   * audience, expiry against the app's clock, and claims of the expected shape.
   */
  async verify(token: string): Promise<VisitorClaims | VisitorTokenRefusal> {
    try {
      const { payload } = await jwtVerify(token, this.key, {
        algorithms: [ACCESS_TOKEN_ALGORITHM],
        typ: VISITOR_TOKEN_TYPE,
        issuer: ISSUER,
        audience: AUDIENCE,
        currentDate: this.clock.now(),
        requiredClaims: ['exp', 'iat', 'key'],
      });
      const keyId = payload['key'];
      const origin = payload['origin'];
      if (typeof keyId !== 'number' || !Number.isSafeInteger(keyId) || keyId <= 0) return 'invalid';
      if (origin !== undefined && typeof origin !== 'string') return 'invalid';
      if (payload.exp! - payload.iat! > MAX_VISITOR_TOKEN_SECONDS) return 'invalid';
      return {
        keyId,
        ...(origin === undefined ? {} : { origin }),
        ...(payload.sub === undefined ? {} : { visitor: payload.sub }),
        expiresAt: new Date(payload.exp! * 1000),
      };
    } catch (error) {
      return error instanceof errors.JWTExpired ? 'expired' : 'invalid';
    }
  }

  /** Whether a live token is bound to `origin`, so that its preflights are answered. */
  hasLiveOrigin(origin: string): boolean {
    const until = this.liveOrigins.get(origin);
    if (until === undefined) return false;
    if (until > this.clock.now().getTime()) return true;
    this.liveOrigins.delete(origin);
    return false;
  }

  private rememberOrigin(origin: string, untilMs: number): void {
    if (this.liveOrigins.size >= MAX_TOKEN_ORIGINS && !this.liveOrigins.has(origin)) {
      const now = this.clock.now().getTime();
      for (const [known, until] of this.liveOrigins) if (until <= now) this.liveOrigins.delete(known);
    }
    if (this.liveOrigins.size >= MAX_TOKEN_ORIGINS && !this.liveOrigins.has(origin)) return;
    this.liveOrigins.set(origin, Math.max(untilMs, this.liveOrigins.get(origin) ?? 0));
  }
}

/** Whether a bearer value is a visitor token by its header (not verified: `verify` does that). */
export function isVisitorToken(token: string): boolean {
  try {
    return decodeProtectedHeader(token).typ === VISITOR_TOKEN_TYPE;
  } catch {
    return false;
  }
}
