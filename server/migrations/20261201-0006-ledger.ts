import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

const id = { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') };
const createdAt = { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') };
// A company with a ledger is never deleted out from under it: RESTRICT, not CASCADE.
const orgRef = { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'RESTRICT' };
const cents = { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 };

export async function up({ context: qi }: { context: QueryInterface }) {
  // The chart of accounts. `system_key` is the role the posting rules post to (accounts_receivable,
  // customer_deposits ...), so a company can renumber and rename its accounts freely.
  await qi.createTable('accounts', {
    id,
    organization_id: { ...orgRef, onDelete: 'CASCADE' },
    code: { type: DataTypes.STRING(10), allowNull: false },
    name: { type: DataTypes.STRING(120), allowNull: false },
    type: { type: DataTypes.ENUM('asset', 'liability', 'equity', 'revenue', 'expense', 'contra_revenue'), allowNull: false },
    system_key: { type: DataTypes.STRING(40), allowNull: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    created_at: createdAt,
    updated_at: createdAt,
  });
  await qi.addIndex('accounts', ['organization_id', 'code'], { unique: true, name: 'accounts_org_code' });
  await qi.sequelize.query(`CREATE UNIQUE INDEX accounts_org_system_key ON accounts (organization_id, system_key) WHERE system_key IS NOT NULL`);
  // Lets journal lines reference (account, organization) together: a line can never post to another company's account.
  await qi.sequelize.query(`ALTER TABLE accounts ADD CONSTRAINT accounts_id_org UNIQUE (id, organization_id)`);

  await qi.createTable('journal_entries', {
    id,
    organization_id: orgRef,
    booking_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'bookings', key: 'id' }, onDelete: 'RESTRICT' },
    customer_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'customers', key: 'id' }, onDelete: 'RESTRICT' },
    occurred_at: { type: DataTypes.DATE, allowNull: false },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    memo: { type: DataTypes.STRING(400), allowNull: false, defaultValue: '' },
    source_type: { type: DataTypes.STRING(40), allowNull: true },
    source_id: { type: DataTypes.UUID, allowNull: true },
    reverses_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'journal_entries', key: 'id' }, onDelete: 'RESTRICT' },
    // RESTRICT, not SET NULL: setting it null would be an UPDATE, which the ledger refuses.
    created_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'RESTRICT' },
    created_at: createdAt,
  });
  await qi.addIndex('journal_entries', ['organization_id', 'occurred_at']);
  await qi.addIndex('journal_entries', ['booking_id']);
  await qi.addIndex('journal_entries', ['customer_id', 'occurred_at']);
  await qi.addIndex('journal_entries', ['source_type', 'source_id']);
  // An entry is reversed at most once.
  await qi.sequelize.query(`CREATE UNIQUE INDEX journal_entries_reverses_once ON journal_entries (reverses_id) WHERE reverses_id IS NOT NULL`);
  await qi.sequelize.query(`ALTER TABLE journal_entries ADD CONSTRAINT journal_entries_id_org UNIQUE (id, organization_id)`);

  await qi.createTable('journal_lines', {
    id,
    organization_id: orgRef,
    entry_id: { type: DataTypes.UUID, allowNull: false },
    position: { type: DataTypes.SMALLINT, allowNull: false, defaultValue: 0 },
    account_id: { type: DataTypes.UUID, allowNull: false },
    debit_cents: cents,
    credit_cents: cents,
    // On customer-deposit lines: the revenue account (by system key) this deferred amount becomes on
    // the event date, so recognition follows the invoices' own split to the cent.
    revenue_key: { type: DataTypes.STRING(40), allowNull: true },
  });
  await qi.addIndex('journal_lines', ['entry_id']);
  await qi.addIndex('journal_lines', ['organization_id', 'account_id']);
  await qi.sequelize.query(`
    ALTER TABLE journal_lines
      ADD CONSTRAINT journal_lines_entry FOREIGN KEY (entry_id, organization_id) REFERENCES journal_entries (id, organization_id) ON DELETE RESTRICT,
      ADD CONSTRAINT journal_lines_account FOREIGN KEY (account_id, organization_id) REFERENCES accounts (id, organization_id) ON DELETE RESTRICT,
      ADD CONSTRAINT journal_lines_one_side CHECK (debit_cents >= 0 AND credit_cents >= 0 AND (debit_cents > 0) <> (credit_cents > 0))`);

  // At commit, every entry that gained lines (and every new entry, so one with no lines at all is
  // caught too) must have two lines or more whose debits equal its credits.
  await qi.sequelize.query(`
    CREATE FUNCTION journal_entry_must_balance() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE
      eid uuid; n integer; d numeric; c numeric;
    BEGIN
      IF TG_TABLE_NAME = 'journal_entries' THEN eid := NEW.id; ELSE eid := NEW.entry_id; END IF;
      SELECT count(*), coalesce(sum(debit_cents), 0), coalesce(sum(credit_cents), 0) INTO n, d, c
        FROM journal_lines WHERE entry_id = eid;
      IF n < 2 OR d <> c THEN
        RAISE EXCEPTION 'journal entry % does not balance: % line(s), debits % cents, credits % cents', eid, n, d, c
          USING ERRCODE = 'check_violation', CONSTRAINT = 'journal_entry_balances';
      END IF;
      RETURN NULL;
    END $$`);
  await qi.sequelize.query(`
    CREATE CONSTRAINT TRIGGER journal_lines_balance AFTER INSERT ON journal_lines
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION journal_entry_must_balance()`);
  await qi.sequelize.query(`
    CREATE CONSTRAINT TRIGGER journal_entries_balance AFTER INSERT ON journal_entries
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION journal_entry_must_balance()`);

  // Entries are never edited or deleted: a mistake is corrected by a reversing entry.
  await qi.sequelize.query(`
    CREATE FUNCTION ledger_is_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% on % refused: the ledger is append-only; post a reversing entry instead', TG_OP, TG_TABLE_NAME
        USING ERRCODE = 'restrict_violation';
    END $$`);
  for (const table of ['journal_entries', 'journal_lines']) {
    await qi.sequelize.query(`CREATE TRIGGER ${table}_no_change BEFORE UPDATE OR DELETE ON ${table} FOR EACH ROW EXECUTE FUNCTION ledger_is_append_only()`);
    await qi.sequelize.query(`CREATE TRIGGER ${table}_no_truncate BEFORE TRUNCATE ON ${table} FOR EACH STATEMENT EXECUTE FUNCTION ledger_is_append_only()`);
  }
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('journal_lines');
  await qi.dropTable('journal_entries');
  await qi.dropTable('accounts');
  await qi.sequelize.query('DROP FUNCTION IF EXISTS journal_entry_must_balance(), ledger_is_append_only()');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_accounts_type');
}
