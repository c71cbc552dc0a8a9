import { Router } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import { IdParams } from '../../../shared/schemas/common';
import { AvailabilityQuery, ItemInput, ItemListQuery, type ImportReport, type ItemAvailability, type ItemValues } from '../../../shared/schemas/items';
import { zonedDays } from '../../../shared/dates';
import { audit } from '../../commands/audit';
import { withTransaction } from '../../db';
import { HttpError, conflict } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { singleFile } from '../../middlewares/upload';
import { parsed, validate } from '../../middlewares/validate';
import { Item } from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { presentItem } from '../../presenters/item';
import { findHolds, peakHeld } from '../../services/availability';
import { readItemCsv } from '../../services/itemCsv';
import { rulesOf } from '../../services/rules';

export const itemsRouter = Router();

function skuTaken(err: unknown) {
  return (err as { name?: string; parent?: { constraint?: string } })?.parent?.constraint === 'items_org_sku';
}
const skuConflict = () => conflict('Another item already has that SKU.', 'sku_taken', { sku: 'Another item already has that SKU.' });

itemsRouter.get('/', authenticate, validate(ItemListQuery, 'query'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'item', 'list');
  const q = parsed<ItemListQuery>(res, 'query');
  const where: WhereOptions = { organizationId: user.organizationId };
  if (q.kind) Object.assign(where, { kind: q.kind });
  if (q.active !== 'all') Object.assign(where, { active: q.active === 'true' });
  if (q.q) Object.assign(where, { [Op.or]: [{ name: { [Op.iLike]: `%${q.q}%` } }, { sku: { [Op.iLike]: `%${q.q}%` } }] });
  // Crew see no prices, so they cannot sort by them either.
  const sort = q.sort === 'rentalPriceCents' && user.role === 'crew' ? 'name' : q.sort;
  const { rows, count } = await Item.findAndCountAll({
    where,
    order: [[sort, q.dir.toUpperCase()], ['name', 'ASC'], ['id', 'ASC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  res.json({ data: rows.map((i) => presentItem(i, user)), total: count });
});

itemsRouter.post('/', authenticate, validate(ItemInput), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'item', 'create');
  const values = parsed<ItemValues>(res);
  const item = await withTransaction(async (t) => {
    const created = await Item.create({ ...values, organizationId: user.organizationId }, { transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'item.created', subjectType: 'item', subjectId: created.id, data: { name: created.name } }, req, t);
    return created;
  }).catch((err) => {
    throw skuTaken(err) ? skuConflict() : err;
  });
  res.status(201).json(presentItem(item, user));
});

itemsRouter.post('/import', authenticate, singleFile(1024 * 1024), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'item', 'import');
  const dryRun = req.query.dryRun === 'true' || req.query.dryRun === '1';
  const bytes = req.file!.buffer;
  if (bytes.includes(0)) throw new HttpError(415, 'unsupported_media_type', 'That file is not text: upload a .csv file.', { file: 'Not a CSV file.' });
  const text = new TextDecoder('utf-8', { fatal: false }).decode(bytes);
  const read = readItemCsv(text);
  if ('fileError' in read) throw new HttpError(400, 'malformed_csv', read.fileError, { file: read.fileError });

  const rejected: ImportReport['rejected'] = read.rows
    .filter((r) => Object.keys(r.errors).length)
    .map((r) => ({ line: r.line, sku: r.raw.sku ?? '', name: r.raw.name ?? '', errors: r.errors }));
  // SKUs must be unique within the file and against the catalog.
  const seen = new Map<string, number>();
  const skus = read.rows.map((r) => (r.values?.sku ?? '').toLowerCase()).filter(Boolean);
  const existing = skus.length
    ? new Set((await Item.findAll({ where: { organizationId: user.organizationId }, attributes: ['sku'] })).map((i) => i.sku.toLowerCase()))
    : new Set<string>();
  for (const r of read.rows) {
    const sku = (r.values?.sku ?? '').toLowerCase();
    if (!sku) continue;
    const problem = existing.has(sku) ? 'Another item already has that SKU.' : seen.has(sku) ? `Same SKU as line ${seen.get(sku)}.` : null;
    seen.set(sku, r.line);
    if (problem) rejected.push({ line: r.line, sku: r.raw.sku ?? '', name: r.raw.name ?? '', errors: { sku: problem } });
  }
  rejected.sort((a, b) => a.line - b.line);
  const report: ImportReport = { rows: read.rows.length, created: 0, rejected, dryRun };
  if (rejected.length) {
    throw new HttpError(422, 'import_rejected', `${rejected.length} of ${read.rows.length} rows have problems; nothing was imported.`, undefined, { report });
  }
  if (!dryRun) {
    await withTransaction(async (t) => {
      await Item.bulkCreate(read.rows.map((r) => ({ ...r.values!, organizationId: user.organizationId })), { transaction: t });
      await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'item.imported', subjectType: 'item', subjectId: null, data: { rows: read.rows.length, file: req.file!.originalname } }, req, t);
    });
    report.created = read.rows.length;
  }
  res.status(dryRun ? 200 : 201).json(report);
});

itemsRouter.get('/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const item = sameOrganization(user, await Item.findByPk(parsed<{ id: string }>(res, 'params').id), 'That item');
  authorize(user, 'item', 'read', item);
  res.json(presentItem(item, user));
});

itemsRouter.put('/:id', authenticate, validate(IdParams, 'params'), validate(ItemInput), async (req, res) => {
  const { user } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const values = parsed<ItemValues>(res);
  const item = await withTransaction(async (t) => {
    const found = sameOrganization(user, await Item.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That item');
    authorize(user, 'item', 'update', found);
    found.set(values);
    const changed = found.changed() || [];
    await found.save({ transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'item.updated', subjectType: 'item', subjectId: found.id, data: { changed } }, req, t);
    return found;
  }).catch((err) => {
    throw skuTaken(err) ? skuConflict() : err;
  });
  res.json(presentItem(item, user));
});

itemsRouter.get('/:id/availability', authenticate, validate(IdParams, 'params'), validate(AvailabilityQuery, 'query'), async (req, res) => {
  const { user, organization } = auth(req);
  const item = sameOrganization(user, await Item.findByPk(parsed<{ id: string }>(res, 'params').id), 'That item');
  authorize(user, 'item', 'read', item);
  const q = parsed<AvailabilityQuery>(res, 'query');
  const from = new Date(q.from);
  const to = new Date(q.to);
  const holds = await findHolds(user.organizationId, [item.id], from, to, rulesOf(organization).turnaroundHours, { excludeBookingId: q.excludeBookingId });
  const body: ItemAvailability = {
    itemId: item.id,
    name: item.name,
    quantityOwned: item.quantityOwned,
    from: from.toISOString(),
    to: to.toISOString(),
    free: Math.max(0, item.quantityOwned - peakHeld(holds, from, to)),
    days: zonedDays(from, to, organization.timeZone).map((d) => {
      const reserved = peakHeld(holds, d.start < from ? from : d.start, d.end > to ? to : d.end);
      return { date: d.date, reserved, free: Math.max(0, item.quantityOwned - reserved) };
    }),
    holds: holds.map((h) => ({ bookingId: h.bookingId, reference: h.reference, status: h.status, quantity: h.quantity, start: h.start.toISOString(), end: h.end.toISOString() })),
  };
  res.json(body);
});
