import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * Closed periods: each company's lock date ("the books are closed through"), one row per company
 * in `period_locks`. Nothing posts on or before it: `assertPeriodOpen` (server/ledger/periods.ts)
 * says so with a 409 first, and a trigger on journal_entries refuses any insert that got past it
 * (a script, a path that forgot). An entry's date is its `occurred_at` on the company's calendar.
 *
 * The row is also the lock that serializes posting with closing: posting reads it FOR SHARE,
 * closing FOR UPDATE. A closing therefore waits for entries being posted, and entries posted while
 * a closing is under way wait for it and then see the new date. A row of its own rather than a
 * column of `organizations`: that row is updated by booking numbers and settings, which would then
 * queue behind every invoice being issued (whose PDF is made inside the transaction).
 *
 * Every company gets its row with the company (a trigger), so there is always a row to lock.
 * Also: account codes may no longer start with -, +, = or @ (a spreadsheet runs such a cell as a
 * formula); NOT VALID, so a code already saved that way stays until the owner changes it.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('period_locks', {
    organization_id: { type: DataTypes.UUID, primaryKey: true, references: { model: 'organizations', key: 'id' }, onDelete: 'CASCADE' },
    // Null: nothing is closed.
    closed_through: { type: DataTypes.DATEONLY, allowNull: true },
    closed_by_id: { type: DataTypes.UUID, allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    closed_at: { type: DataTypes.DATE, allowNull: true },
  });
  await qi.sequelize.query(`INSERT INTO period_locks (organization_id) SELECT id FROM organizations ON CONFLICT DO NOTHING`);
  await qi.sequelize.query(`
    CREATE FUNCTION organization_gets_period_lock() RETURNS trigger LANGUAGE plpgsql AS $$
    BEGIN
      INSERT INTO period_locks (organization_id) VALUES (NEW.id) ON CONFLICT DO NOTHING;
      RETURN NULL;
    END $$`);
  await qi.sequelize.query(`
    CREATE TRIGGER organizations_period_lock AFTER INSERT ON organizations FOR EACH ROW EXECUTE FUNCTION organization_gets_period_lock()`);

  // Once per statement, over the rows it inserted (a transition table): a bulk insert of thousands
  // of entries locks each company's row once and checks them in one query.
  await qi.sequelize.query(`
    CREATE FUNCTION journal_entries_in_open_period() RETURNS trigger LANGUAGE plpgsql AS $$
    DECLARE held record; first_day date;
    BEGIN
      FOR held IN
        SELECT p.organization_id, p.closed_through, o.time_zone
          FROM period_locks p JOIN organizations o ON o.id = p.organization_id
         WHERE p.organization_id IN (SELECT DISTINCT organization_id FROM inserted)
         ORDER BY p.organization_id
           FOR SHARE OF p
      LOOP
        IF held.closed_through IS NOT NULL THEN
          SELECT min((n.occurred_at AT TIME ZONE held.time_zone)::date) INTO first_day FROM inserted n WHERE n.organization_id = held.organization_id;
          IF first_day <= held.closed_through THEN
            RAISE EXCEPTION 'period_closed: the books are closed through %; a journal entry dated % is refused', held.closed_through, first_day
              USING ERRCODE = 'check_violation', CONSTRAINT = 'journal_entry_in_open_period';
          END IF;
        END IF;
      END LOOP;
      RETURN NULL;
    END $$`);
  await qi.sequelize.query(`
    CREATE TRIGGER journal_entries_open_period AFTER INSERT ON journal_entries
      REFERENCING NEW TABLE AS inserted FOR EACH STATEMENT EXECUTE FUNCTION journal_entries_in_open_period()`);

  await qi.sequelize.query(`ALTER TABLE accounts ADD CONSTRAINT accounts_code_not_formula CHECK (code !~ '^[-+=@]') NOT VALID`);
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.sequelize.query(`ALTER TABLE accounts DROP CONSTRAINT IF EXISTS accounts_code_not_formula`);
  await qi.sequelize.query(`DROP TRIGGER IF EXISTS journal_entries_open_period ON journal_entries`);
  await qi.sequelize.query(`DROP TRIGGER IF EXISTS organizations_period_lock ON organizations`);
  await qi.sequelize.query(`DROP FUNCTION IF EXISTS journal_entries_in_open_period(), organization_gets_period_lock()`);
  await qi.dropTable('period_locks');
}
