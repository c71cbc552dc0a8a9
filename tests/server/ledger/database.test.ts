import { QueryTypes } from 'sequelize';
import { describe, expect, it } from 'vitest';
import { sequelize, withTransaction } from '../../../server/db';
import { ensureChart } from '../../../server/ledger/chart';
import { LedgerError, postEntry, reverseEntry } from '../../../server/ledger/post';
import { Account, JournalEntry, JournalLine } from '../../../server/models';
import { buildCompany, buildOrganization } from '../../factories';

async function chartOf(organizationId: string) {
  await withTransaction((t) => ensureChart(organizationId, t));
  const accounts = await Account.findAll({ where: { organizationId } });
  return Object.fromEntries(accounts.map((a) => [a.systemKey!, a.id]));
}

/** Inserts an entry and lines with plain SQL, as a buggy or careless writer would, in one transaction. */
async function insertRaw(organizationId: string, lines: { accountId: string; debit: number; credit: number }[]) {
  return withTransaction(async (t) => {
    const [{ id }] = await sequelize.query<{ id: string }>(
      `INSERT INTO journal_entries (organization_id, occurred_at, kind, memo) VALUES (:org, now(), 'payment_received', 'raw') RETURNING id`,
      { replacements: { org: organizationId }, type: QueryTypes.SELECT, transaction: t },
    );
    for (const l of lines) {
      await sequelize.query(
        `INSERT INTO journal_lines (organization_id, entry_id, account_id, debit_cents, credit_cents) VALUES (:org, :id, :acc, :d, :c)`,
        { replacements: { org: organizationId, id, acc: l.accountId, d: l.debit, c: l.credit }, transaction: t },
      );
    }
    return id;
  });
}

describe('the database guards the ledger', () => {
  it('refuses at commit an entry whose debits and credits differ, one with a single line, and one with none', async () => {
    const org = await buildOrganization();
    const a = await chartOf(org.id);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 10_000, credit: 0 }, { accountId: a.accounts_receivable, debit: 0, credit: 9_000 }]))
      .rejects.toThrow(/does not balance: 2 line\(s\), debits 10000 cents, credits 9000 cents/);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 10_000, credit: 0 }])).rejects.toThrow(/does not balance: 1 line/);
    await expect(insertRaw(org.id, [])).rejects.toThrow(/does not balance: 0 line/);
    expect(await JournalEntry.count({ where: { organizationId: org.id } })).toBe(0);

    const ok = await insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 10_000, credit: 0 }, { accountId: a.accounts_receivable, debit: 0, credit: 10_000 }]);
    expect(await JournalLine.count({ where: { entryId: ok } })).toBe(2);
  });

  it('refuses a line with both sides, neither side, a negative amount, or another company\'s account', async () => {
    const org = await buildOrganization();
    const other = await buildOrganization();
    const a = await chartOf(org.id);
    const b = await chartOf(other.id);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 5, credit: 5 }, { accountId: a.bank, debit: 5, credit: 5 }])).rejects.toThrow(/journal_lines_one_side/);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 0, credit: 0 }, { accountId: a.bank, debit: 0, credit: 0 }])).rejects.toThrow(/journal_lines_one_side/);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: -5, credit: 0 }, { accountId: a.bank, debit: 0, credit: -5 }])).rejects.toThrow(/journal_lines_one_side/);
    await expect(insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 5, credit: 0 }, { accountId: b.bank, debit: 0, credit: 5 }])).rejects.toThrow(/journal_lines_account/);
  });

  it('refuses UPDATE, DELETE and TRUNCATE of journal lines and entries', async () => {
    const org = await buildOrganization();
    const a = await chartOf(org.id);
    const id = await insertRaw(org.id, [{ accountId: a.cash_on_hand, debit: 2_500, credit: 0 }, { accountId: a.accounts_receivable, debit: 0, credit: 2_500 }]);
    const q = (sql: string) => sequelize.query(sql, { replacements: { id } });
    await expect(q(`UPDATE journal_lines SET debit_cents = 2600 WHERE entry_id = :id AND debit_cents > 0`)).rejects.toThrow(/UPDATE on journal_lines refused: the ledger is append-only/);
    await expect(q(`DELETE FROM journal_lines WHERE entry_id = :id`)).rejects.toThrow(/DELETE on journal_lines refused/);
    await expect(q(`UPDATE journal_entries SET memo = 'edited' WHERE id = :id`)).rejects.toThrow(/UPDATE on journal_entries refused/);
    await expect(q(`DELETE FROM journal_entries WHERE id = :id`)).rejects.toThrow(/DELETE on journal_entries refused/);
    await expect(q(`TRUNCATE journal_lines, journal_entries`)).rejects.toThrow(/TRUNCATE on journal_\w+ refused/);
    expect((await JournalLine.findAll({ where: { entryId: id } })).map((l) => l.debitCents + l.creditCents)).toEqual([2_500, 2_500]);
  });
});

describe('postEntry and reverseEntry', () => {
  it('refuse an unbalanced entry in code, with a sentence naming the lines, before the database sees it', async () => {
    const org = await buildOrganization();
    const attempt = withTransaction((t) =>
      postEntry({ organizationId: org.id, kind: 'payment_received', memo: 'x', occurredAt: new Date(), lines: [{ account: 'cash_on_hand', debitCents: 100 }, { account: 'accounts_receivable', creditCents: 99 }] }, t),
    );
    await expect(attempt).rejects.toThrow(LedgerError);
    await expect(attempt).rejects.toThrow('The entry does not balance: debits 100 cents, credits 99 cents (cash_on_hand Dr 100, accounts_receivable Cr 99).');
    await expect(withTransaction((t) => postEntry({ organizationId: org.id, kind: 'invoice_issued', memo: 'x', occurredAt: new Date(), lines: [{ account: 'accounts_receivable', debitCents: 100 }, { account: 'customer_deposits', creditCents: 100 }] }, t)))
      .rejects.toThrow(/names the revenue account it becomes/);
    expect(await JournalEntry.count({ where: { organizationId: org.id } })).toBe(0);
  });

  it('reverse an entry with its mirror once, by a user of the company, and never a reversal', async () => {
    const { organization: org, owner } = await buildCompany();
    const { owner: stranger } = await buildCompany();
    const entry = await withTransaction((t) =>
      postEntry({ organizationId: org.id, kind: 'payment_received', memo: 'Check 1042', occurredAt: new Date(), lines: [{ account: 'cash_on_hand', debitCents: 7_500 }, { account: 'accounts_receivable', creditCents: 7_500 }] }, t),
    );
    await expect(withTransaction((t) => reverseEntry(entry.id, 'Bounced', stranger.id, t))).rejects.toThrow(/not a user of this company/);
    await expect(withTransaction((t) => reverseEntry(entry.id, '  ', owner.id, t))).rejects.toThrow(/Say why/);
    const reversal = await withTransaction((t) => reverseEntry(entry.id, 'Check bounced', owner.id, t));
    expect(reversal).toMatchObject({ kind: 'reversal', reversesId: entry.id, createdById: owner.id, memo: 'Reverses payment received: Check bounced' });
    const lines = await JournalLine.findAll({ where: { entryId: reversal.id }, order: [['position', 'ASC']] });
    const original = await JournalLine.findAll({ where: { entryId: entry.id }, order: [['position', 'ASC']] });
    expect(lines.map((l) => [l.accountId, l.debitCents, l.creditCents])).toEqual(original.map((l) => [l.accountId, l.creditCents, l.debitCents]));
    await expect(withTransaction((t) => reverseEntry(entry.id, 'again', owner.id, t))).rejects.toThrow(/already reversed/);
    await expect(withTransaction((t) => reverseEntry(reversal.id, 'undo', owner.id, t))).rejects.toThrow(/A reversal is not reversed/);
  });
});

describe('ensureChart', () => {
  it('creates the fourteen default accounts once, even when two transactions race to do it', async () => {
    const org = await buildOrganization();
    await Promise.all([withTransaction((t) => ensureChart(org.id, t)), withTransaction((t) => ensureChart(org.id, t))]);
    await withTransaction((t) => ensureChart(org.id, t));
    const accounts = await Account.findAll({ where: { organizationId: org.id }, order: [['code', 'ASC']] });
    expect(accounts.map((a) => `${a.code} ${a.type} ${a.systemKey}`)).toEqual([
      '1000 asset cash_on_hand', '1010 asset bank', '1050 asset card_clearing', '1200 asset accounts_receivable',
      '2100 liability customer_deposits', '2120 liability customer_credit', '2150 liability security_deposits_held', '2200 liability sales_tax_payable',
      '4000 revenue rental_revenue', '4100 revenue delivery_labor_revenue', '4200 revenue damage_waiver_revenue',
      '4300 revenue damage_recovery', '4900 contra_revenue refunds', '6100 expense card_processing_fees',
    ]);
  });

  it('does not recreate an account the company renumbered and renamed', async () => {
    const org = await buildOrganization();
    await withTransaction((t) => ensureChart(org.id, t));
    await Account.update({ code: '4010', name: 'Tent and party rentals' }, { where: { organizationId: org.id, systemKey: 'rental_revenue' } });
    await withTransaction((t) => ensureChart(org.id, t));
    expect(await Account.count({ where: { organizationId: org.id } })).toBe(14);
  });
});
