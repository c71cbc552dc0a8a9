import { Router } from 'express';
import { Op } from 'sequelize';
import { z } from 'zod';
import { PlannerRequest, type PlannerStock } from '../../../shared/schemas/planner';
import { QuoteRequest, type QuoteInput } from '../../../shared/schemas/quote';
import { CompanyRules } from '../../../shared/schemas/rules';
import { plan } from '../../../shared/planner';
import { quote } from '../../../shared/quote';
import { audit } from '../../commands/audit';
import { requoteBookings } from '../../commands/bookingTotals';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { fieldErrors, parsed, validate } from '../../middlewares/validate';
import { badRequest } from '../../errors';
import { Item, Organization } from '../../models';
import { authorize } from '../../policies';
import { checkAvailability } from '../../services/availability';
import { presentRules } from '../../presenters/rules';
import { rulesOf } from '../../services/rules';

/** The planner, the quote preview, live availability and the company's rules. */
export const planningRouter = Router();

async function stockOf(organizationId: string): Promise<PlannerStock> {
  const items = await Item.findAll({ where: { organizationId, active: true, kind: { [Op.in]: ['tent', 'table', 'chair', 'sidewall', 'lighting'] } }, order: [['name', 'ASC']] });
  const stock: PlannerStock = { tents: [], tables: [], chairs: [], sidewalls: [], lighting: [] };
  for (const i of items) {
    const base = { itemId: i.id, name: i.name, quantity: i.quantityOwned };
    if (i.kind === 'tent' && i.widthFt && i.lengthFt) stock.tents.push({ ...base, tentType: i.tentType ?? 'pole', widthFt: i.widthFt, lengthFt: i.lengthFt });
    if (i.kind === 'table' && i.lengthFt) stock.tables.push({ ...base, lengthFt: i.lengthFt, seats: i.seats ?? 0 });
    if (i.kind === 'chair') stock.chairs.push(base);
    if (i.kind === 'sidewall' && i.sectionLengthFt) stock.sidewalls.push({ ...base, sectionLengthFt: i.sectionLengthFt, heightFt: i.heightFt ?? 7 });
    if (i.kind === 'lighting') stock.lighting.push(base);
  }
  return stock;
}

planningRouter.post('/planner', authenticate, validate(PlannerRequest), async (req, res) => {
  const { user, organization } = auth(req);
  res.json(plan(parsed<PlannerRequest>(res), await stockOf(user.organizationId), rulesOf(organization)));
});

planningRouter.post('/quotes/preview', authenticate, validate(QuoteRequest), (req, res) => {
  const { user } = auth(req);
  authorize(user, 'booking', 'previewQuote');
  res.json(quote(parsed<QuoteInput>(res)));
});

const AvailabilityCheck = z
  .object({
    from: z.iso.datetime({ offset: true, error: 'Give from as an ISO date-time.' }),
    to: z.iso.datetime({ offset: true, error: 'Give to as an ISO date-time.' }),
    excludeBookingId: z.uuid().optional(),
    lines: z.array(z.object({ itemId: z.uuid({ error: 'Not an item id.' }), quantity: z.number().int().min(0).max(100_000) })).max(500),
  })
  .refine((v) => new Date(v.to) > new Date(v.from), { path: ['to'], message: 'The end must be after the start.' });

planningRouter.post('/availability/check', authenticate, validate(AvailabilityCheck), async (req, res) => {
  const { user, organization } = auth(req);
  const q = parsed<z.infer<typeof AvailabilityCheck>>(res);
  const data = await checkAvailability(user.organizationId, q.lines, new Date(q.from), new Date(q.to), rulesOf(organization).turnaroundHours, {
    excludeBookingId: q.excludeBookingId,
  });
  res.json({ data });
});

planningRouter.get('/organization/rules', authenticate, (req, res) => {
  const { user, organization } = auth(req);
  res.json(presentRules(organization, user));
});

planningRouter.put('/organization/rules', authenticate, async (req, res) => {
  const { user } = auth(req);
  const org = await withTransaction(async (t) => {
    const o = (await Organization.findByPk(user.organizationId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    authorize(user, 'organization', 'update', o);
    const before = rulesOf(o);
    // The sent fields over the current rules: a form that does not know a newer rule leaves it as it was.
    if (!req.body || typeof req.body !== 'object' || Array.isArray(req.body)) {
      // '_': the body as a whole, as validate() names it.
      const message = 'Send the rules as a JSON object of the fields to change.';
      throw badRequest(message, { _: message });
    }
    const body = req.body as Record<string, unknown>;
    const { can: _can, ...sent } = body;
    const result = CompanyRules.safeParse({ ...before, ...sent });
    if (!result.success) {
      const fields = fieldErrors(result.error);
      throw badRequest(Object.keys(fields).length === 1 ? Object.values(fields)[0] : `Check the ${Object.keys(fields).length} highlighted fields.`, fields);
    }
    const rules = result.data;
    o.rules = rules;
    await o.save({ transaction: t });
    // Delivery bands, the damage waiver and what is taxed price every booking: the stored totals follow.
    await requoteBookings(o, t);
    await audit({ organizationId: o.id, actorUserId: user.id, action: 'organization.rules_updated', subjectType: 'organization', subjectId: o.id, data: { before, after: rules } }, req, t);
    return o;
  });
  res.json(presentRules(org, user));
});
