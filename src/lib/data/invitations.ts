import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { serverEnv } from '../env';
import { requireStudyAccess } from '../auth/access';
import { hashPassword } from '../auth/password';
import type { StudyRole } from '../auth/permissions';
import type { SessionUser } from '../auth/session-user';
import { conflict, forbidden, HttpError, notFound } from '../http/errors';
import {
  generateInvitationToken,
  hashInvitationToken,
  invitationExpiry,
  invitationStatus,
  looksLikeInvitationToken,
  type InvitationStatus,
} from '../invitations/token';
import { enqueueMail, kickOutbox } from '../mail/outbox';
import { invitationMail } from '../mail/templates';
import { recordAudit } from './audit';

export interface PendingInvitation {
  id: number;
  email: string;
  role: StudyRole;
  invitedBy: string;
  expiresAt: string;
  createdAt: string;
}

interface InvitationRow {
  id: number;
  study_id: number;
  email: string;
  role: StudyRole;
  invited_by: number;
  expires_at: Date;
  accepted_at: Date | null;
  revoked_at: Date | null;
}

function stateOf(row: InvitationRow) {
  return { expiresAt: new Date(row.expires_at), acceptedAt: row.accepted_at, revokedAt: row.revoked_at };
}

/** Invitations of a study that can still be used. */
export async function listPendingInvitations(viewer: SessionUser, studyId: number): Promise<PendingInvitation[]> {
  await requireStudyAccess(viewer, studyId, 'members.manage');
  const rows = await db('invitations')
    .join('users', 'users.id', 'invitations.invited_by')
    .where('invitations.study_id', studyId)
    .whereNull('invitations.accepted_at')
    .whereNull('invitations.revoked_at')
    .where('invitations.expires_at', '>', new Date())
    .orderBy('invitations.created_at', 'desc')
    .select('invitations.*', 'users.name as inviter_name');
  return rows.map((row) => ({
    id: row.id,
    email: row.email,
    role: row.role,
    invitedBy: row.inviter_name,
    expiresAt: new Date(row.expires_at).toISOString(),
    createdAt: new Date(row.created_at).toISOString(),
  }));
}

/** A new invitation; its e-mail is queued, not yet sent, when the invitation is returned. */
export interface CreatedInvitation extends PendingInvitation {
  mailStatus: 'queued';
}

/**
 * Invites an address to a study and e-mails the single-use link. The e-mail joins the mail outbox in
 * the same transaction as the row, so a stored invitation always has its e-mail on the way, and a
 * mail relay that is down only delays it (the outbox retries). Inviting the same address again
 * replaces its earlier pending invitation.
 */
export async function createInvitation(
  actor: SessionUser,
  studyId: number,
  input: { email: string; role: StudyRole },
): Promise<CreatedInvitation> {
  const token = generateInvitationToken();
  const expiresAt = invitationExpiry(new Date(), serverEnv().INVITATION_TTL_HOURS);

  const id = await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'members.manage', trx);
    const study = await trx('studies').where({ id: studyId }).first('name');
    const alreadyMember = await trx('study_members')
      .join('users', 'users.id', 'study_members.user_id')
      .where({ 'study_members.study_id': studyId, 'users.email': input.email })
      .first('study_members.role');
    if (alreadyMember) {
      throw conflict(`${input.email} is already on this study as ${alreadyMember.role}.`, [
        { path: 'email', message: 'Already a member of this study.' },
      ]);
    }
    await trx('invitations')
      .where({ study_id: studyId, email: input.email })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .update({ revoked_at: new Date() });
    const [invitationId] = await trx('invitations').insert({
      study_id: studyId,
      email: input.email,
      role: input.role,
      token_hash: hashInvitationToken(token),
      invited_by: actor.id,
      expires_at: expiresAt,
    });
    await recordAudit(trx, {
      studyId,
      actorId: actor.id,
      action: 'invitation.create',
      targetTable: 'invitations',
      targetId: invitationId,
      details: { email: input.email, role: input.role },
    });
    const link = `${serverEnv().APP_URL}/invite/${token}`;
    await enqueueMail(
      trx,
      { to: input.email, ...invitationMail({ studyName: study.name, inviterName: actor.name, role: input.role, link, expiresAt }) },
      { kind: 'invitation', studyId },
    );
    return invitationId as number;
  });
  kickOutbox();

  return {
    id,
    email: input.email,
    role: input.role,
    invitedBy: actor.name,
    expiresAt: expiresAt.toISOString(),
    createdAt: new Date().toISOString(),
    mailStatus: 'queued',
  };
}

/** Withdraws a pending invitation; its link stops working. */
export async function revokeInvitation(actor: SessionUser, studyId: number, invitationId: number): Promise<void> {
  await db.transaction(async (trx) => {
    await requireStudyAccess(actor, studyId, 'members.manage', trx);
    const changed = await trx('invitations')
      .where({ id: invitationId, study_id: studyId })
      .whereNull('accepted_at')
      .whereNull('revoked_at')
      .update({ revoked_at: new Date() });
    if (changed === 0) throw notFound('No pending invitation with that id on this study.');
    await recordAudit(trx, { studyId, actorId: actor.id, action: 'invitation.revoke', targetTable: 'invitations', targetId: invitationId });
  });
}

export interface InvitationView {
  status: InvitationStatus;
  studyName: string;
  email: string;
  role: StudyRole;
  inviterName: string;
  expiresAt: string;
  /** Whether an account already exists for the invited address (then the invitee signs in to join). */
  accountExists: boolean;
}

async function findByToken(trx: Knex | Knex.Transaction, token: string, lock: boolean): Promise<InvitationRow | undefined> {
  if (!looksLikeInvitationToken(token)) return undefined;
  const query = trx('invitations').where('token_hash', hashInvitationToken(token));
  if (lock) query.forUpdate();
  return query.first();
}

/** What the invitation link shows, to anyone holding the token. Unknown tokens are a 404. */
export async function viewInvitation(token: string): Promise<InvitationView> {
  const row = await findByToken(db, token, false);
  if (!row) throw notFound('This invitation link is not valid.');
  const [study, inviter, account] = await Promise.all([
    db('studies').where({ id: row.study_id }).first('name'),
    db('users').where({ id: row.invited_by }).first('name'),
    db('users').where({ email: row.email }).first('id'),
  ]);
  return {
    status: invitationStatus(stateOf(row)),
    studyName: study.name,
    email: row.email,
    role: row.role,
    inviterName: inviter.name,
    expiresAt: new Date(row.expires_at).toISOString(),
    accountExists: Boolean(account),
  };
}

const STATUS_MESSAGES: Record<Exclude<InvitationStatus, 'valid'>, string> = {
  expired: 'This invitation has expired. Ask for a new one.',
  used: 'This invitation has already been used.',
  revoked: 'This invitation was withdrawn. Ask for a new one.',
};

/** Locks a usable invitation row for the rest of the transaction, or explains why it cannot be used. */
async function lockUsableInvitation(trx: Knex.Transaction, token: string): Promise<InvitationRow> {
  const row = await findByToken(trx, token, true);
  if (!row) throw notFound('This invitation link is not valid.');
  const status = invitationStatus(stateOf(row));
  if (status !== 'valid') throw new HttpError(410, STATUS_MESSAGES[status]);
  return row;
}

async function joinStudy(trx: Knex.Transaction, invitation: InvitationRow, userId: number): Promise<void> {
  const existing = await trx('study_members').where({ study_id: invitation.study_id, user_id: userId }).first('id');
  if (!existing) {
    await trx('study_members').insert({ study_id: invitation.study_id, user_id: userId, role: invitation.role });
  }
  await trx('invitations').where({ id: invitation.id }).update({ accepted_at: new Date(), accepted_by: userId });
  await recordAudit(trx, {
    studyId: invitation.study_id,
    actorId: userId,
    action: 'invitation.accept',
    targetTable: 'invitations',
    targetId: invitation.id,
    details: { role: invitation.role },
  });
}

/** Accepting as a new person: creates the account (site role member) and joins the study, at once. */
export async function acceptInvitationWithNewAccount(
  token: string,
  input: { name: string; password: string },
): Promise<{ studyId: number; email: string }> {
  const passwordHash = await hashPassword(input.password);
  return db.transaction(async (trx) => {
    const invitation = await lockUsableInvitation(trx, token);
    const existing = await trx('users').where({ email: invitation.email }).first('id');
    if (existing) throw conflict('An account with this e-mail address exists already. Sign in to join the study.');
    const [userId] = await trx('users').insert({
      email: invitation.email,
      name: input.name,
      password_hash: passwordHash,
      site_role: 'member',
    });
    await recordAudit(trx, { actorId: userId, action: 'account.create.invited', targetTable: 'users', targetId: userId });
    await joinStudy(trx, invitation, userId);
    return { studyId: invitation.study_id, email: invitation.email };
  });
}

/** Accepting as the signed-in owner of the invited address. */
export async function acceptInvitationAsUser(actor: SessionUser, token: string): Promise<{ studyId: number }> {
  return db.transaction(async (trx) => {
    const invitation = await lockUsableInvitation(trx, token);
    if (invitation.email !== actor.email) {
      throw forbidden(`This invitation was sent to ${invitation.email}. Sign in with that address to accept it.`);
    }
    await joinStudy(trx, invitation, actor.id);
    return { studyId: invitation.study_id };
  });
}
