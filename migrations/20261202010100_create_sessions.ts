import type { Knex } from 'knex';

// The table connect-pg-simple expects (its table.sql), created here so the store never creates it itself.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE "session" (
      "sid" varchar NOT NULL COLLATE "default" PRIMARY KEY,
      "sess" json NOT NULL,
      "expire" timestamp(6) NOT NULL
    )`);
  await knex.raw(`CREATE INDEX "IDX_session_expire" ON "session" ("expire")`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('session');
}
