import type { Knex } from 'knex';

/** People who use the lab's Flakeline, their one-time links, and the session store. */
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (table) => {
    table.bigIncrements('id');
    table.text('email').notNullable().unique();
    table.text('display_name').notNullable();
    table.text('role').notNullable();
    table.text('status').notNullable().defaultTo('invited');
    table.text('password_hash');
    table.bigInteger('invited_by_id').references('users.id').onDelete('SET NULL').index();
    table.timestamp('last_sign_in_at', { useTz: true });
    table.timestamps(true, true);
    table.check("role in ('manager', 'researcher', 'reviewer')", [], 'users_role_known');
    table.check("status in ('invited', 'active', 'deactivated')", [], 'users_status_known');
    table.check('email = lower(email)', [], 'users_email_lower_case');
    table.check("status <> 'active' or password_hash is not null", [], 'users_active_have_password');
  });

  await knex.schema.createTable('link_tokens', (table) => {
    table.bigIncrements('id');
    table.bigInteger('user_id').notNullable().references('users.id').onDelete('CASCADE').index();
    table.text('purpose').notNullable();
    // Only the SHA-256 of the token is kept, so a database copy cannot be used to sign in.
    table.text('token_hash').notNullable().unique();
    table.timestamp('expires_at', { useTz: true }).notNullable();
    table.timestamp('used_at', { useTz: true });
    table.timestamp('revoked_at', { useTz: true });
    table.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    table.check("purpose in ('invitation', 'password_reset')", [], 'link_tokens_purpose_known');
  });

  // The table connect-pg-simple expects (its table.sql), created here so the app needs no DDL rights.
  await knex.schema.createTable('session', (table) => {
    table.string('sid').primary();
    table.json('sess').notNullable();
    table.timestamp('expire', { precision: 6 }).notNullable().index('session_expire_idx');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('session');
  await knex.schema.dropTable('link_tokens');
  await knex.schema.dropTable('users');
}
