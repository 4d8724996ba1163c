/**
 * A stand-in for src/lib/invitations/token that records every token it issues, so tests read the
 * tokens as they are made instead of from the e-mails that carry them:
 *
 *   jest.mock('@/lib/invitations/token', () => jest.requireActual('<path to>/unit/support/recorded-invitation-tokens').recordingTokenModule());
 *   const { issuedForTest } = jest.requireMock('@/lib/invitations/token') as { issuedForTest: string[] };
 */
export function recordingTokenModule() {
  const actual = jest.requireActual('../../src/lib/invitations/token');
  const issued: string[] = [];
  return {
    ...actual,
    issuedForTest: issued,
    generateInvitationToken: () => {
      const token = actual.generateInvitationToken();
      issued.push(token);
      return token;
    },
  };
}
