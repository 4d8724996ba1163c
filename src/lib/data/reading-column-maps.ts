import 'server-only';
import type { Knex } from 'knex';
import { db } from '../db';
import { requireStudyAccess } from '../auth/access';
import type { SessionUser } from '../auth/session-user';
import { csvColumnMapSchema, type CsvColumnMap } from '../validations/reading-import';
import { fromJsonColumn, toJsonColumn } from './json-column';

/**
 * The CSV column mapping a study last imported readings with, offered again for the next file.
 * Saved by the import itself (src/lib/data/reading-import.ts), in the import's transaction.
 */

export interface SavedColumnMap {
  mapping: CsvColumnMap;
  updatedAt: string;
}

/** The study's remembered mapping (everyone who sees the study); null when none was saved or it no longer reads as a mapping. */
export async function getColumnMap(viewer: SessionUser, studyId: number): Promise<SavedColumnMap | null> {
  await requireStudyAccess(viewer, studyId, 'study.view');
  const row = await db('reading_column_maps').where({ study_id: studyId }).first('mapping', 'updated_at');
  if (!row) return null;
  // A mapping saved by an earlier version of the app may not parse now; offering nothing beats offering garbage.
  const parsed = csvColumnMapSchema.safeParse(fromJsonColumn(row.mapping));
  return parsed.success ? { mapping: parsed.data, updatedAt: new Date(row.updated_at).toISOString() } : null;
}

/** Inside the caller's transaction, after it checked the actor may import: replaces the study's mapping. */
export async function saveColumnMap(trx: Knex.Transaction, studyId: number, mapping: CsvColumnMap, actorId: number): Promise<void> {
  await trx('reading_column_maps')
    .insert({ study_id: studyId, mapping: toJsonColumn(mapping), updated_by: actorId, updated_at: trx.fn.now() })
    .onConflict('study_id')
    .merge(['mapping', 'updated_by', 'updated_at']);
}
