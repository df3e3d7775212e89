import type { Knex } from 'knex';

/**
 * Scenario settings gain the heat-pump sizing rule, the study period, the energy price escalation
 * and the equipment family; editable scenarios get the defaults written in (frozen ones keep what
 * they were frozen with: the schema reads missing settings as their defaults). Buildings gain
 * `creditGainsAtDesign` (false).
 */
const SETTINGS_DEFAULTS = {
  heatPumpSizing: 'compressor',
  studyPeriodYears: 20,
  energyEscalationPctPerYear: 0,
  equipmentFamily: null,
};

export async function up(knex: Knex): Promise<void> {
  await knex.raw('UPDATE scenarios SET settings = ?::jsonb || settings WHERE frozen_at IS NULL', [
    JSON.stringify(SETTINGS_DEFAULTS),
  ]);
  await knex.raw(
    `UPDATE projects SET building = building || '{"creditGainsAtDesign": false}'::jsonb
     WHERE building IS NOT NULL AND jsonb_typeof(building) = 'object' AND building->'creditGainsAtDesign' IS NULL`,
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(
    `UPDATE scenarios SET settings = settings - 'heatPumpSizing' - 'studyPeriodYears' - 'energyEscalationPctPerYear' - 'equipmentFamily'
     WHERE frozen_at IS NULL`,
  );
  await knex.raw(
    `UPDATE projects SET building = building - 'creditGainsAtDesign' WHERE building IS NOT NULL AND jsonb_typeof(building) = 'object'`,
  );
}
