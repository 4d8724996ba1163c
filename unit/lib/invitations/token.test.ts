import {
  generateInvitationToken,
  hashInvitationToken,
  invitationExpiry,
  invitationStatus,
  looksLikeInvitationToken,
} from '../../../src/lib/invitations/token';

const created = new Date('2026-03-02T09:00:00Z');
const expiresAt = invitationExpiry(created, 72);

describe('invitation expiry', () => {
  it('expires exactly ttl hours after creation', () => {
    expect(expiresAt.toISOString()).toBe('2026-03-05T09:00:00.000Z');
  });
  it('is valid until the last millisecond before expiry, expired from then on', () => {
    const state = { expiresAt, acceptedAt: null, revokedAt: null };
    expect(invitationStatus(state, new Date('2026-03-05T08:59:59.999Z'))).toBe('valid');
    expect(invitationStatus(state, new Date('2026-03-05T09:00:00.000Z'))).toBe('expired');
    expect(invitationStatus(state, new Date('2027-01-01T00:00:00Z'))).toBe('expired');
  });
  it('a used invitation reads as used even after expiry; a revoked one as revoked', () => {
    const late = new Date('2026-04-01T00:00:00Z');
    expect(invitationStatus({ expiresAt, acceptedAt: created, revokedAt: null }, late)).toBe('used');
    expect(invitationStatus({ expiresAt, acceptedAt: null, revokedAt: created }, late)).toBe('revoked');
  });
});

describe('invitation tokens', () => {
  it('are 43 url-safe characters (256 random bits) and never repeat', () => {
    const tokens = new Set(Array.from({ length: 200 }, () => generateInvitationToken()));
    expect(tokens.size).toBe(200);
    for (const token of tokens) expect(looksLikeInvitationToken(token)).toBe(true);
  });
  it('are stored only as their SHA-256 (FIPS 180-4 test vector "abc")', () => {
    expect(hashInvitationToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
  it('rejects malformed tokens before any lookup', () => {
    expect(looksLikeInvitationToken('')).toBe(false);
    expect(looksLikeInvitationToken('../../etc/passwd')).toBe(false);
    expect(looksLikeInvitationToken('a'.repeat(44))).toBe(false);
  });
});
