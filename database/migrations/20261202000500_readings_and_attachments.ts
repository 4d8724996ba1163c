import type { Knex } from 'knex';

/**
 * What the bench produces. A point can carry one reading per method (M by open-circuit voltage and the
 * efficiency by direct power at the same pose, say). Readings are immutable: a correction is a new row
 * (version n + 1) of the same point and method that names the row it supersedes and why; nothing updates or deletes a reading, so the
 * full history stays visible. Points are RESTRICTed so a plan with readings cannot lose them (only
 * drafts can be deleted or have their points rewritten, and a draft has no readings).
 * Attachments keep the object's key, checked type, size and SHA-256; the bytes live in object storage.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('attachments', (t) => {
    t.bigIncrements('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('RESTRICT');
    t.bigInteger('point_id').unsigned().nullable().references('id').inTable('sweep_points').onDelete('RESTRICT');
    // photo | instrument (a file from an instrument: Touchstone, CSV, text, PDF)
    t.string('kind', 20).notNullable();
    // studies/<studyId>/plans/<planId>/<uuid>: generated, never from the uploaded name
    t.string('object_key', 200).notNullable().unique();
    t.string('file_name', 200).notNullable();
    // the type detected from the content, not the one the browser claimed
    t.string('content_type', 100).notNullable();
    t.bigInteger('size_bytes').unsigned().notNullable();
    t.string('sha256', 64).notNullable();
    t.string('caption', 500).nullable();
    t.integer('uploaded_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.index(['plan_id', 'point_id']);
  });

  await knex.schema.createTable('readings', (t) => {
    t.bigIncrements('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('RESTRICT');
    t.bigInteger('point_id').unsigned().notNullable().references('id').inTable('sweep_points').onDelete('RESTRICT');
    // 1 for the first reading of a point by a method; each correction adds one
    t.integer('version').notNullable();
    t.bigInteger('supersedes_id').unsigned().nullable().references('id').inTable('readings').onDelete('RESTRICT');
    t.text('correction_reason').nullable();
    // MeasurementMethod (src/physics/measurement/methods.ts)
    t.string('method', 40).notNullable();
    // the method's raw inputs in SI, as entered (RawReading)
    t.json('raw').notNullable();
    // relative accuracy of the instrument and phase accuracy, as entered (InstrumentAccuracy)
    t.json('accuracy').notNullable();
    // Derivation: measured M, k, efficiency with uncertainties, the formula's id and version, warnings
    t.json('derived').notNullable();
    // { distance, lateralOffset, tiltDeg } when the achieved pose differs from the planned one
    t.json('achieved_pose').nullable();
    t.string('instrument', 200).nullable();
    t.enum('calibration', ['in_date', 'overdue', 'unknown']).notNullable().defaultTo('unknown');
    t.double('temperature_c').nullable();
    // nearby metal, fixtures, anything that may explain a difference
    t.text('setup_notes').nullable();
    // how the reading arrived: typed in, a CSV import, or parsed from an uploaded Touchstone file
    t.enum('source', ['form', 'csv', 'touchstone']).notNullable().defaultTo('form');
    t.string('import_id', 36).nullable();
    t.bigInteger('attachment_id').unsigned().nullable().references('id').inTable('attachments').onDelete('RESTRICT');
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['point_id', 'method', 'version']);
    t.index(['plan_id', 'point_id']);
    t.index(['import_id']);
  });

  // Before the first reading on a plan each person acknowledges the study's cautions; the text they
  // saw is identified by its version so a later change to the wording asks again.
  await knex.schema.createTable('caution_acknowledgements', (t) => {
    t.increments('id').primary();
    t.integer('plan_id').unsigned().notNullable().references('id').inTable('sweep_plans').onDelete('CASCADE');
    t.integer('user_id').unsigned().notNullable().references('id').inTable('users').onDelete('CASCADE');
    t.string('cautions_version', 20).notNullable();
    t.datetime('acknowledged_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['plan_id', 'user_id', 'cautions_version']);
  });

  // The column mapping a study last used to import readings from CSV, offered again next time.
  await knex.schema.createTable('reading_column_maps', (t) => {
    t.integer('study_id').unsigned().primary().references('id').inTable('studies').onDelete('CASCADE');
    // CsvColumnMap (src/lib/readings/csv-mapping.ts)
    t.json('mapping').notNullable();
    t.integer('updated_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('reading_column_maps');
  await knex.schema.dropTableIfExists('caution_acknowledgements');
  await knex.schema.dropTableIfExists('readings');
  await knex.schema.dropTableIfExists('attachments');
}
