import { Router } from 'express';
import { fileTypeFromBuffer } from 'file-type';
import { LOGO_MAX_BYTES, LOGO_TYPES } from '../../../shared/schemas/documents';
import { HttpError, notFound } from '../../errors';
import { singleFile } from '../../middlewares/upload';
import { keptImage } from '../../services/images';
import { deleteFile, readFile, storeFile } from '../../services/storage';
import { UpdateOrganizationRequest } from '../../../shared/schemas/organization';
import { audit } from '../../commands/audit';
import { withTransaction } from '../../db';
import { auth, authenticate } from '../../middlewares/authenticate';
import { parsed, validate } from '../../middlewares/validate';
import { Organization } from '../../models';
import { authorize } from '../../policies';
import { presentOrganization } from '../../presenters/organization';

export const organizationRouter = Router();

// The logo printed in the header of the company's documents: PNG or JPEG, checked by content.
organizationRouter.post('/logo', authenticate, (req, _res, next) => {
  const { user, organization } = auth(req);
  authorize(user, 'organization', 'update', organization);
  next();
}, singleFile(LOGO_MAX_BYTES), async (req, res) => {
  const { user } = auth(req);
  const file = req.file!;
  const detected = await fileTypeFromBuffer(file.buffer);
  if (!detected || !(LOGO_TYPES as readonly string[]).includes(detected.mime)) {
    throw new HttpError(415, 'unsupported_media_type', 'Upload the logo as a PNG or JPEG image.', { file: 'Not a PNG or JPEG.' });
  }
  // Refused by its header when too large; kept at the size the documents print it.
  const logo = await keptImage(file.buffer, 'logo');
  const org = await withTransaction(async (t) => {
    const o = (await Organization.findByPk(user.organizationId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    const old = o.logoFileId;
    const name = (file.originalname.replace(/\.[^.]*$/, '').slice(0, 200) || 'logo') + `.${logo.ext}`;
    const stored = await storeFile({ organizationId: o.id, filename: name, contentType: logo.contentType, data: logo.data, purpose: 'logo' }, t);
    o.logoFileId = stored.id;
    await o.save({ transaction: t });
    if (old) await deleteFile(o.id, old, t);
    await audit({ organizationId: o.id, actorUserId: user.id, action: 'organization.logo_updated', subjectType: 'organization', subjectId: o.id, data: { sha256: stored.sha256 } }, req, t);
    return o;
  });
  res.json(presentOrganization(org, user));
});

organizationRouter.get('/logo', authenticate, async (req, res) => {
  const { organization } = auth(req);
  const file = organization.logoFileId ? await readFile(organization.id, organization.logoFileId) : null;
  if (!file) throw notFound('The logo');
  res.setHeader('Content-Type', file.contentType);
  res.setHeader('X-Content-Type-Options', 'nosniff');
  res.setHeader('Cache-Control', 'private, no-cache');
  res.send(file.data);
});

organizationRouter.delete('/logo', authenticate, async (req, res) => {
  const { user } = auth(req);
  const org = await withTransaction(async (t) => {
    const o = (await Organization.findByPk(user.organizationId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    authorize(user, 'organization', 'update', o);
    if (o.logoFileId) {
      const old = o.logoFileId;
      o.logoFileId = null;
      await o.save({ transaction: t });
      await deleteFile(o.id, old, t);
    }
    return o;
  });
  res.json(presentOrganization(org, user));
});

organizationRouter.get('/', authenticate, (req, res) => {
  const { user, organization } = auth(req);
  authorize(user, 'organization', 'read', organization);
  res.json(presentOrganization(organization, user));
});

organizationRouter.patch('/', authenticate, validate(UpdateOrganizationRequest), async (req, res) => {
  const { user } = auth(req);
  const input = parsed<UpdateOrganizationRequest>(res);
  const org = await withTransaction(async (t) => {
    const o = (await Organization.findByPk(user.organizationId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    authorize(user, 'organization', 'update', o);
    const before = o.get({ plain: true });
    o.set(input);
    const changed = (o.changed() || []) as string[];
    await o.save({ transaction: t });
    await audit(
      { organizationId: o.id, actorUserId: user.id, action: 'organization.updated', subjectType: 'organization', subjectId: o.id, data: { changed: Object.fromEntries(changed.map((k) => [k, { from: (before as Record<string, unknown>)[k], to: o.get(k) }])) } },
      req,
      t,
    );
    return o;
  });
  res.json(presentOrganization(org, user));
});
