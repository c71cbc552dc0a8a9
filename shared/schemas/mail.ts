import { z } from 'zod';

/** GET /api/dev/mail: what the local mail sink caught, newest first. */
export const CaughtMail = z.object({
  id: z.string(),
  to: z.array(z.string()),
  from: z.string(),
  subject: z.string(),
  text: z.string(),
  html: z.string(),
  date: z.string(),
  attachments: z.array(z.object({ filename: z.string(), contentType: z.string(), size: z.number(), sha256: z.string() })),
});
export type CaughtMail = z.infer<typeof CaughtMail>;
