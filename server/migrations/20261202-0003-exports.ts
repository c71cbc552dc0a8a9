import { DataTypes, Sequelize, type QueryInterface } from 'sequelize';

/**
 * The bookkeeper's exports: a history row per export run, and a stable number for every journal
 * entry, counted per company (1, 2, 3 ... with no gaps), so a journal line in an export can be
 * found again in Guyline and in the bookkeeper's own books.
 *
 * The number is given when the entry's transaction commits (a deferred trigger), not when the row
 * is inserted: the company's counter row is then locked only for the last instant of the
 * transaction, so two money events of one company never wait on each other for their whole
 * length and cannot deadlock over the counter. A rolled-back entry takes no number, so there are
 * no gaps. Numbers follow commit order.
 *
 * The ledger stays append-only: the one change the guard now lets through is giving an entry its
 * number once (NULL to a number, every other column unchanged).
 */

const APPEND_ONLY_BEFORE = `
    CREATE OR REPLACE FUNCTION ledger_is_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      RAISE EXCEPTION '% on % refused: the ledger is append-only; post a reversing entry instead', TG_OP, TG_TABLE_NAME
        USING ERRCODE = 'restrict_violation';
    END $$`;

const APPEND_ONLY_WITH_NUMBERS = `
    CREATE OR REPLACE FUNCTION ledger_is_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      -- Nested IFs: journal_lines rows have no entry_number, so the test must not reach them.
      IF TG_OP = 'UPDATE' AND TG_TABLE_NAME = 'journal_entries' THEN
        IF OLD.entry_number IS NULL AND NEW.entry_number IS NOT NULL
           AND (to_jsonb(NEW) - 'entry_number') = (to_jsonb(OLD) - 'entry_number') THEN
          RETURN NEW;
        END IF;
      END IF;
      RAISE EXCEPTION '% on % refused: the ledger is append-only; post a reversing entry instead', TG_OP, TG_TABLE_NAME
        USING ERRCODE = 'restrict_violation';
    END $$`;

export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('export_runs', {
    id: { type: DataTypes.UUID, primaryKey: true, defaultValue: Sequelize.literal('gen_random_uuid()') },
    organization_id: { type: DataTypes.UUID, allowNull: false, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    kind: { type: DataTypes.STRING(40), allowNull: false },
    // The trial balance has a closing date only.
    from_date: { type: DataTypes.DATEONLY, allowNull: true },
    to_date: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.ENUM('running', 'ok', 'failed', 'aborted'), allowNull: false, defaultValue: 'running' },
    row_count: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    byte_count: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 },
    error: { type: DataTypes.STRING(500), allowNull: true },
    started_at: { type: DataTypes.DATE, allowNull: false, defaultValue: Sequelize.literal('now()') },
    finished_at: { type: DataTypes.DATE, allowNull: true },
  });
  await qi.addIndex('export_runs', ['organization_id', 'started_at']);

  await qi.addColumn('journal_entries', 'entry_number', { type: DataTypes.BIGINT, allowNull: true });
  await qi.sequelize.query(APPEND_ONLY_WITH_NUMBERS);
  // Existing entries, in the order they were posted.
  await qi.sequelize.query(`
    UPDATE journal_entries e SET entry_number = n.number
      FROM (SELECT id, row_number() OVER (PARTITION BY organization_id ORDER BY created_at, occurred_at, id) AS number FROM journal_entries) n
     WHERE n.id = e.id`);
  await qi.createTable('journal_entry_counters', {
    organization_id: { type: DataTypes.UUID, primaryKey: true, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    next_number: { type: DataTypes.BIGINT, allowNull: false, defaultValue: 1 },
  });
  await qi.sequelize.query(`
    INSERT INTO journal_entry_counters (organization_id, next_number)
    SELECT organization_id, max(entry_number) + 1 FROM journal_entries GROUP BY organization_id`);
  await qi.sequelize.query(`CREATE UNIQUE INDEX journal_entries_org_number ON journal_entries (organization_id, entry_number)`);
  await qi.sequelize.query(`
    CREATE FUNCTION journal_entry_take_number() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE n bigint;
    BEGIN
      INSERT INTO journal_entry_counters AS c (organization_id, next_number) VALUES (NEW.organization_id, 2)
        ON CONFLICT (organization_id) DO UPDATE SET next_number = c.next_number + 1
        RETURNING c.next_number - 1 INTO n;
      UPDATE journal_entries SET entry_number = n WHERE id = NEW.id;
      RETURN NULL;
    END $$`);
  await qi.sequelize.query(`
    CREATE CONSTRAINT TRIGGER journal_entries_number AFTER INSERT ON journal_entries
      DEFERRABLE INITIALLY DEFERRED FOR EACH ROW EXECUTE FUNCTION journal_entry_take_number()`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query('DROP TRIGGER IF EXISTS journal_entries_number ON journal_entries');
  await qi.sequelize.query('DROP FUNCTION IF EXISTS journal_entry_take_number()');
  await qi.dropTable('journal_entry_counters');
  await qi.sequelize.query('DROP INDEX IF EXISTS journal_entries_org_number');
  await qi.sequelize.query(APPEND_ONLY_BEFORE);
  // Dropping a column is DDL: the append-only row triggers do not fire for it.
  await qi.removeColumn('journal_entries', 'entry_number');
  await qi.dropTable('export_runs');
  await qi.sequelize.query('DROP TYPE IF EXISTS enum_export_runs_status');
}
