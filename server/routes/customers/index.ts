import { Router } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import { Op, col, fn, where, type WhereOptions } from 'sequelize';
import { IdParams } from '../../../shared/schemas/common';
import { CERTIFICATE_MAX_BYTES, CERTIFICATE_TYPES, CustomerInput, CustomerListQuery, type CustomerValues } from '../../../shared/schemas/customers';
import { audit } from '../../commands/audit';
import { requoteBookings } from '../../commands/bookingTotals';
import { withTransaction } from '../../db';
import { HttpError, notFound } from '../../errors';
import { auth, authenticate } from '../../middlewares/authenticate';
import { singleFile } from '../../middlewares/upload';
import { parsed, validate } from '../../middlewares/validate';
import { Booking, Customer, StoredFile, type User } from '../../models';
import { authorize, sameOrganization } from '../../policies';
import { presentCustomer } from '../../presenters/customer';
import { contentDisposition } from '../../services/downloads';
import { deleteFile, readFile, storeFile } from '../../services/storage';

export const customersRouter = Router();

async function present(customers: Customer[], actor: User) {
  const ids = customers.map((c) => c.id);
  const certIds = customers.map((c) => c.exemptionCertificateId).filter((x): x is string => !!x);
  const [certs, counts] = await Promise.all([
    certIds.length ? StoredFile.findAll({ where: { id: { [Op.in]: certIds }, organizationId: actor.organizationId } }) : [],
    ids.length
      ? (Booking.findAll({
          attributes: ['customerId', [fn('COUNT', col('id')), 'n']],
          where: { customerId: { [Op.in]: ids }, organizationId: actor.organizationId },
          group: ['customerId'],
          raw: true,
        }) as unknown as Promise<{ customerId: string; n: string }[]>)
      : [],
  ]);
  const certById = new Map(certs.map((f) => [f.id, f]));
  const countById = new Map(counts.map((r) => [r.customerId, Number(r.n)]));
  return customers.map((c) =>
    presentCustomer(c, actor, {
      certificate: c.exemptionCertificateId ? (certById.get(c.exemptionCertificateId) ?? null) : null,
      bookingCount: countById.get(c.id) ?? 0,
    }),
  );
}

customersRouter.get('/', authenticate, validate(CustomerListQuery, 'query'), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'customer', 'list');
  const q = parsed<CustomerListQuery>(res, 'query');
  const filter: WhereOptions = { organizationId: user.organizationId };
  if (q.q) {
    const like = `%${q.q}%`;
    const digits = q.q.replace(/\D/g, '');
    const anyOf: WhereOptions[] = [
      { name: { [Op.iLike]: like } },
      { contactName: { [Op.iLike]: like } },
      { email: { [Op.iLike]: like } },
      { phone: { [Op.iLike]: like } },
    ];
    // "555 0142" finds "(555) 014-2": compare digits only.
    if (digits.length >= 3) anyOf.push(where(fn('regexp_replace', col('phone'), '\\D', '', 'g'), { [Op.like]: `%${digits}%` }));
    Object.assign(filter, { [Op.or]: anyOf });
  }
  const { rows, count } = await Customer.findAndCountAll({
    where: filter,
    order: [['name', 'ASC'], ['id', 'ASC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  res.json({ data: await present(rows, user), total: count });
});

customersRouter.post('/', authenticate, validate(CustomerInput), async (req, res) => {
  const { user } = auth(req);
  authorize(user, 'customer', 'create');
  const values = parsed<CustomerValues>(res);
  const customer = await withTransaction(async (t) => {
    const c = await Customer.create({ ...values, organizationId: user.organizationId }, { transaction: t });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'customer.created', subjectType: 'customer', subjectId: c.id, data: { name: c.name } }, req, t);
    return c;
  });
  res.status(201).json((await present([customer], user))[0]);
});

customersRouter.get('/:id', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  authorize(user, 'customer', 'read', customer);
  res.json((await present([customer], user))[0]);
});

customersRouter.put('/:id', authenticate, validate(IdParams, 'params'), validate(CustomerInput), async (req, res) => {
  const { user, organization } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const values = parsed<CustomerValues>(res);
  const customer = await withTransaction(async (t) => {
    const c = sameOrganization(user, await Customer.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That customer');
    authorize(user, 'customer', 'update', c);
    c.set(values);
    const changed = c.changed() || [];
    await c.save({ transaction: t });
    // The sales tax of the customer's bookings follows the exemption: their stored totals too.
    if (changed.includes('taxExempt')) await requoteBookings(organization, t, { customerId: c.id });
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'customer.updated', subjectType: 'customer', subjectId: c.id, data: { changed } }, req, t);
    return c;
  });
  res.json((await present([customer], user))[0]);
});

customersRouter.post('/:id/exemption-certificate', authenticate, validate(IdParams, 'params'), async (req, res, next) => {
  // Authorize before reading the upload, so a forbidden user's file is never taken in.
  const { user } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  authorize(user, 'customer', 'update', customer);
  res.locals.customer = customer;
  next();
}, singleFile(CERTIFICATE_MAX_BYTES), async (req, res) => {
  const { user } = auth(req);
  const file = req.file!;
  const detected = await fileTypeFromBuffer(file.buffer);
  if (!detected || !(CERTIFICATE_TYPES as readonly string[]).includes(detected.mime)) {
    throw new HttpError(415, 'unsupported_media_type', 'Upload the certificate as a PDF, PNG, JPEG or WEBP file.', { file: 'Not a PDF or image.' });
  }
  const customer = await withTransaction(async (t) => {
    const c = (await Customer.findByPk((res.locals.customer as Customer).id, { transaction: t, lock: t.LOCK.UPDATE }))!;
    const old = c.exemptionCertificateId;
    const stored = await storeFile(
      { organizationId: user.organizationId, filename: file.originalname.slice(0, 255) || `certificate.${detected.ext}`, contentType: detected.mime, data: file.buffer, purpose: 'exemption_certificate' },
      t,
    );
    c.exemptionCertificateId = stored.id;
    await c.save({ transaction: t });
    if (old) await deleteFile(user.organizationId, old, t);
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'customer.certificate_uploaded', subjectType: 'customer', subjectId: c.id, data: { fileId: stored.id, sha256: stored.sha256, size: stored.size } }, req, t);
    return c;
  });
  res.json((await present([customer], user))[0]);
});

customersRouter.get('/:id/exemption-certificate', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const customer = sameOrganization(user, await Customer.findByPk(parsed<{ id: string }>(res, 'params').id), 'That customer');
  authorize(user, 'customer', 'readCertificate', customer);
  const file = customer.exemptionCertificateId ? await readFile(user.organizationId, customer.exemptionCertificateId) : null;
  if (!file) throw notFound('The certificate');
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('Content-Disposition', contentDisposition(file.filename));
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.send(file.data);
});

customersRouter.delete('/:id/exemption-certificate', authenticate, validate(IdParams, 'params'), async (req, res) => {
  const { user } = auth(req);
  const { id } = parsed<{ id: string }>(res, 'params');
  const customer = await withTransaction(async (t) => {
    const c = sameOrganization(user, await Customer.findByPk(id, { transaction: t, lock: t.LOCK.UPDATE }), 'That customer');
    authorize(user, 'customer', 'update', c);
    const old = c.exemptionCertificateId;
    if (!old) throw notFound('The certificate');
    c.exemptionCertificateId = null;
    await c.save({ transaction: t });
    await deleteFile(user.organizationId, old, t);
    await audit({ organizationId: user.organizationId, actorUserId: user.id, action: 'customer.certificate_removed', subjectType: 'customer', subjectId: c.id }, req, t);
    return c;
  });
  res.json((await present([customer], user))[0]);
});
