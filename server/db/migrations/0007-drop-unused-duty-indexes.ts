import type { QueryInterface } from 'sequelize';

/**
 * No query reads trip duties or wear days by vehicle (they go by damper, driver or trip), and
 * every index costs the nightly job a B-tree insert per row: 120 000 duty rows and about as many
 * wear days on a 10 000-vehicle night. Vehicles are retired, never deleted, so the foreign keys
 * do not need these indexes either.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.removeIndex('trip_duties', ['vehicle_id', 'trip_date']);
  await qi.removeIndex('damper_wear_days', ['vehicle_id', 'day']);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.addIndex('trip_duties', ['vehicle_id', 'trip_date']);
  await qi.addIndex('damper_wear_days', ['vehicle_id', 'day']);
}
