import type { Knex } from 'knex';

/**
 * A study's coil library and its saved setups (two coils, a placement and a drive circuit), all in SI.
 * `spec`, `placement` and `circuit` hold the solver's own shapes (src/physics/types.ts) as JSON, so
 * what is stored is exactly what is solved. A coil a setup uses cannot be deleted (RESTRICT): the app
 * refuses first with a message naming the setups, the keys keep that true under any race.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('coils', (t) => {
    t.increments('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    // Also inside `spec`; a column so lists can filter and sort by kind.
    t.enum('kind', ['loop', 'helix', 'spiral']).notNullable();
    // CoilSpec in SI: radius / innerRadius / outerRadius / length / wireDiameter / strandDiameter [m], turns, ...
    t.json('spec').notNullable();
    // The wire as written on the reel ("AWG 18"); spec.wireDiameter is what the solver uses.
    t.string('wire_label', 60).nullable();
    t.double('measured_inductance_h').nullable();
    t.double('measured_resistance_ohm').nullable();
    t.double('measured_q').nullable();
    t.double('measured_at_hz').nullable();
    t.text('notes').nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['study_id', 'name']);
  });

  await knex.schema.createTable('setups', (t) => {
    t.increments('id').primary();
    t.integer('study_id').unsigned().notNullable().references('id').inTable('studies').onDelete('CASCADE');
    t.string('name', 120).notNullable();
    t.integer('transmitter_coil_id').unsigned().notNullable().references('id').inTable('coils').onDelete('RESTRICT');
    t.integer('receiver_coil_id').unsigned().notNullable().references('id').inTable('coils').onDelete('RESTRICT');
    // { distance, lateralOffset, tiltDeg } [m, m, degrees]
    t.json('placement').notNullable();
    // CircuitSpec: frequency [Hz], topology, sourceVoltage [V rms], sourceResistance, loadResistance [ohm], tx/rxCapacitance [F]
    t.json('circuit').notNullable();
    // [x, y, z] [m] where an operator stands, for the field reading; null when not set
    t.json('operator_point').nullable();
    // { position: [x, y, z], target: [x, y, z] } [m] of the 3D view's camera
    t.json('view').nullable();
    t.text('notes').nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at').notNullable().defaultTo(knex.fn.now());
    t.datetime('updated_at').notNullable().defaultTo(knex.fn.now());
    t.unique(['study_id', 'name']);
    t.index(['transmitter_coil_id']);
    t.index(['receiver_coil_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('setups');
  await knex.schema.dropTableIfExists('coils');
}
