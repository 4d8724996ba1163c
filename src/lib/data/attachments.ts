import 'server-only';
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { HttpError, notFound, unprocessable } from '../http/errors';
import { checkAttachmentContent, type AttachmentContentType, type AttachmentKind } from '../storage/content-type';
import { attachmentObjectKey, sanitizeFileName } from '../storage/object-keys';
import { deleteObject, putObject, readObject, signedDownloadUrl } from '../storage/object-store';
import { attachmentFieldsSchema } from '../validations/attachment';
import { recordAudit } from './audit';
import { requirePlanInStudy, requirePlanOnBench } from './plan-lookup';

/** A photo or instrument file attached to a plan or one of its points; the bytes are in the object store. */
export interface Attachment {
  id: number;
  studyId: number;
  planId: number;
  /** null when the file belongs to the whole plan */
  pointId: number | null;
  /** the point's measurement order (1..n), with pointId */
  pointSeq: number | null;
  kind: AttachmentKind;
  /** the uploaded name, made safe for display and download */
  fileName: string;
  /** detected from the content, not the type the browser claimed */
  contentType: AttachmentContentType;
  sizeBytes: number;
  /** SHA-256 of the bytes, lower-case hex */
  sha256: string;
  caption: string | null;
  uploadedBy: { id: number; name: string };
  createdAt: string;
}

/** What an upload carries; `bytes` is the whole file. */
export interface AttachmentUpload {
  kind: AttachmentKind;
  pointId: number | null;
  fileName: string;
  caption: string | null;
  bytes: Buffer;
}

/** How long a download link works by default [s]. */
export const DOWNLOAD_LINK_SECONDS = 300;

interface AttachmentRow {
  id: number | string;
  study_id: number;
  plan_id: number;
  point_id: number | string | null;
  point_seq: number | null;
  kind: AttachmentKind;
  object_key: string;
  file_name: string;
  content_type: AttachmentContentType;
  size_bytes: number | string;
  sha256: string;
  caption: string | null;
  uploaded_by: number;
  uploader_name: string;
  created_at: Date;
}

function toAttachment(row: AttachmentRow): Attachment {
  return {
    id: Number(row.id),
    studyId: row.study_id,
    planId: row.plan_id,
    pointId: row.point_id === null ? null : Number(row.point_id),
    pointSeq: row.point_seq,
    kind: row.kind,
    fileName: row.file_name,
    contentType: row.content_type,
    sizeBytes: Number(row.size_bytes),
    sha256: row.sha256,
    caption: row.caption,
    uploadedBy: { id: row.uploaded_by, name: row.uploader_name },
    createdAt: new Date(row.created_at).toISOString(),
  };
}

/** Attachments of one study with their uploader's name and point's seq. */
function attachmentQuery(trx: Knex | Knex.Transaction, studyId: number) {
  return trx('attachments as a')
    .join('users as u', 'u.id', 'a.uploaded_by')
    .leftJoin('sweep_points as p', 'p.id', 'a.point_id')
    .where('a.study_id', studyId)
    .select(
      'a.id', 'a.study_id', 'a.plan_id', 'a.point_id', 'p.seq as point_seq', 'a.kind', 'a.object_key', 'a.file_name', 'a.content_type',
      'a.size_bytes', 'a.sha256', 'a.caption', 'a.uploaded_by', 'u.name as uploader_name', 'a.created_at',
    );
}

/** One attachment of the study; 404 when the id belongs to another study or none. */
async function findAttachmentRow(studyId: number, attachmentId: number): Promise<AttachmentRow> {
  const row: AttachmentRow | undefined = await attachmentQuery(db, studyId).where('a.id', attachmentId).first();
  if (!row) throw notFound('No such file in this study.');
  return row;
}

/**
 * The plan must be in this study (404) and on the bench (409); the point, when given, one of its
 * points (422 at pointId). With `lock`, the plan row is share-locked so it cannot leave the bench
 * before the caller's transaction ends.
 */
async function requireBenchTarget(trx: Knex | Knex.Transaction, studyId: number, planId: number, pointId: number | null, lock = false) {
  await requirePlanOnBench(trx, studyId, planId, (state) => `Files can be attached only while the plan is on the bench; this plan is ${state}.`, { lock });
  if (pointId !== null && !(await trx('sweep_points').where({ id: pointId, plan_id: planId }).first('id'))) {
    throw unprocessable('Some fields need attention.', [{ path: 'pointId', message: 'Choose a point of this plan.' }]);
  }
}

/**
 * Stores an uploaded photo or instrument file of a plan on the bench (researchers and students).
 * The bytes go to the object store first, then the row and its audit entry in one transaction; if
 * that fails, the object is removed again so no file is left without a row. 503 with no row when the
 * store cannot be reached.
 */
export async function createAttachment(actor: SessionUser, studyId: number, planId: number, input: AttachmentUpload): Promise<Attachment> {
  await requireStudyAccess(actor, studyId, 'readings.log');
  const fields = attachmentFieldsSchema.parse({ kind: input.kind, pointId: input.pointId, caption: input.caption });
  await requireBenchTarget(db, studyId, planId, fields.pointId);
  const { contentType, fileName } = checkAttachmentContent(fields.kind, input.bytes, sanitizeFileName(input.fileName));
  const sha256 = createHash('sha256').update(input.bytes).digest('hex');
  const objectKey = attachmentObjectKey(studyId, planId);

  await putObject(objectKey, input.bytes, contentType);
  let id: number;
  try {
    id = await db.transaction(async (trx) => {
      // Checked again under the lock: the upload took time, and the plan may have moved on.
      await requireStudyAccess(actor, studyId, 'readings.log', trx);
      await requireBenchTarget(trx, studyId, planId, fields.pointId, true);
      const [newId] = await trx('attachments').insert({
        study_id: studyId,
        plan_id: planId,
        point_id: fields.pointId,
        kind: fields.kind,
        object_key: objectKey,
        file_name: fileName,
        content_type: contentType,
        size_bytes: input.bytes.length,
        sha256,
        caption: fields.caption,
        uploaded_by: actor.id,
      });
      await recordAudit(trx, {
        studyId,
        actorId: actor.id,
        action: 'attachment.create',
        targetTable: 'attachments',
        targetId: newId,
        details: { planId, pointId: fields.pointId, kind: fields.kind, fileName, contentType, sizeBytes: input.bytes.length, sha256 },
      });
      return Number(newId);
    });
  } catch (error) {
    await deleteObject(objectKey).catch((cleanupError) => {
      console.error(`Could not remove the stored object ${objectKey} of a failed upload:`, cleanupError);
    });
    throw error;
  }
  return toAttachment(await findAttachmentRow(studyId, id));
}

/** The plan's files, newest first (any member; admins). */
export async function listAttachments(viewer: SessionUser, studyId: number, planId: number): Promise<Attachment[]> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  await requirePlanInStudy(db, studyId, planId);
  const rows: AttachmentRow[] = await attachmentQuery(db, studyId).where('a.plan_id', planId).orderBy('a.created_at', 'desc').orderBy('a.id', 'desc');
  return rows.map(toAttachment);
}

/**
 * A fresh signed link to the file, working for `expiresSeconds` (5 minutes by default), for those who
 * may see the study; the id must belong to this study (404 otherwise).
 */
export async function attachmentDownloadUrl(
  viewer: SessionUser,
  studyId: number,
  attachmentId: number,
  { expiresSeconds = DOWNLOAD_LINK_SECONDS }: { expiresSeconds?: number } = {},
): Promise<string> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row = await findAttachmentRow(studyId, attachmentId);
  return signedDownloadUrl(row.object_key, { fileName: row.file_name, contentType: row.content_type, expiresSeconds });
}

/** The file's bytes, checked against the SHA-256 recorded at upload (e.g. to parse a Touchstone file). */
export async function readAttachmentBytes(viewer: SessionUser, studyId: number, attachmentId: number): Promise<{ attachment: Attachment; bytes: Buffer }> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row = await findAttachmentRow(studyId, attachmentId);
  const bytes = await readObject(row.object_key);
  if (createHash('sha256').update(bytes).digest('hex') !== row.sha256) {
    console.error(`Stored object ${row.object_key} differs from its recorded SHA-256`);
    throw new HttpError(500, 'The stored file does not match the one uploaded; upload it again.');
  }
  return { attachment: toAttachment(row), bytes };
}
