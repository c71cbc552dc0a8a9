import type { Request } from 'express';
import { QueryTypes } from 'sequelize';
import { addDays, dateInZone } from '../../shared/dates';
import { lockDateProblem, type LockDateRow } from '../../shared/schemas/books';
import { sequelize, type Transaction } from '../db';
import { badRequest, forbidden } from '../errors';
import type { User } from '../models';
import { can } from '../policies';
import { audit } from './audit';

interface LockRow {
  closed_through: string | null;
  closed_at: Date | null;
  closed_by: string | null;
  time_zone: string;
}

/**
 * The company's lock date row. `forUpdate` takes it FOR UPDATE: entries being posted hold it FOR
 * SHARE (ledger/periods.ts), so the closing waits for them, and new postings wait for the closing.
 * The row is made with the company (a trigger); a company made before that gets it here.
 */
async function lockRow(organizationId: string, t: Transaction | null, forUpdate: boolean): Promise<LockRow> {
  if (forUpdate) {
    await sequelize.query(`INSERT INTO period_locks (organization_id) VALUES (:org) ON CONFLICT DO NOTHING`, { replacements: { org: organizationId }, transaction: t });
  }
  const [row] = await sequelize.query<LockRow>(
    `SELECT p.closed_through::text AS closed_through, p.closed_at, u.name AS closed_by, o.time_zone
       FROM organizations o
       ${forUpdate ? 'JOIN' : 'LEFT JOIN'} period_locks p ON p.organization_id = o.id
       LEFT JOIN users u ON u.id = p.closed_by_id
      WHERE o.id = :org
      ${forUpdate ? 'FOR UPDATE OF p' : ''}`,
    { replacements: { org: organizationId }, type: QueryTypes.SELECT, transaction: t },
  );
  return row;
}

function present(row: LockRow, actor: User): LockDateRow {
  return {
    closedThrough: row.closed_through,
    closedAt: row.closed_at ? new Date(row.closed_at).toISOString() : null,
    closedBy: row.closed_by,
    latestClosable: addDays(dateInZone(new Date(), row.time_zone), -1),
    can: { close: can(actor, 'ledger', 'close'), reopen: can(actor, 'ledger', 'reopen') },
  };
}

/** The actor's company's lock date, for the screen. */
export async function lockDate(actor: User): Promise<LockDateRow> {
  return present(await lockRow(actor.organizationId, null, false), actor);
}

/**
 * Closes the books through `closedThrough` (never today or later: 400), or moves the date back or
 * clears it (null), which only the owner may (403 for the bookkeeper, naming the current date).
 * Setting the date it already has changes nothing and writes no audit row; any change writes one
 * (`books.closed` or `books.reopened`, from and to).
 */
export async function setLockDate(actor: User, closedThrough: string | null, req: Request | null, t: Transaction): Promise<LockDateRow> {
  const row = await lockRow(actor.organizationId, t, true);
  const problem = lockDateProblem(closedThrough, dateInZone(new Date(), row.time_zone));
  if (problem) throw badRequest(problem, { closedThrough: problem });
  const current = row.closed_through;
  if (closedThrough === current) return present(row, actor);
  const backward = current !== null && (closedThrough === null || closedThrough < current);
  if (backward && !can(actor, 'ledger', 'reopen')) {
    throw forbidden(`The books are closed through ${current}. Only the owner reopens a closed period; ask them to move the date back.`);
  }
  await sequelize.query(`UPDATE period_locks SET closed_through = :closedThrough, closed_by_id = :actor, closed_at = now() WHERE organization_id = :org`, {
    replacements: { closedThrough, actor: actor.id, org: actor.organizationId },
    transaction: t,
  });
  await audit(
    {
      organizationId: actor.organizationId, actorUserId: actor.id, action: backward ? 'books.reopened' : 'books.closed',
      subjectType: 'organization', subjectId: actor.organizationId, data: { from: current, to: closedThrough },
    },
    req,
    t,
  );
  return present(await lockRow(actor.organizationId, t, false), actor);
}
