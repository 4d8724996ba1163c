import { createHash, randomBytes } from 'node:crypto';

/** 32 random bytes: 256 bits, far beyond guessing; base64url so it sits in a URL unescaped. */
const TOKEN_BYTES = 32;

export function generateInvitationToken(): string {
  return randomBytes(TOKEN_BYTES).toString('base64url');
}

/** Only this hash is stored, so a database dump does not hand out working links. */
export function hashInvitationToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A token as we issue it: 43 base64url characters. Anything else is not worth a database query. */
export function looksLikeInvitationToken(token: string): boolean {
  return /^[A-Za-z0-9_-]{43}$/.test(token);
}

export type InvitationStatus = 'valid' | 'expired' | 'used' | 'revoked';

export interface InvitationState {
  expiresAt: Date;
  acceptedAt: Date | null;
  revokedAt: Date | null;
}

/** Whether an invitation can still be used at `now`. Used and revoked win over expiry. */
export function invitationStatus(invitation: InvitationState, now: Date = new Date()): InvitationStatus {
  if (invitation.acceptedAt) return 'used';
  if (invitation.revokedAt) return 'revoked';
  if (now.getTime() >= invitation.expiresAt.getTime()) return 'expired';
  return 'valid';
}

/** Expiry time for an invitation created at `now`, valid for `ttlHours`. */
export function invitationExpiry(now: Date, ttlHours: number): Date {
  return new Date(now.getTime() + ttlHours * 60 * 60 * 1000);
}
