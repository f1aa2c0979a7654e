import { z } from 'zod';

/** A message caught by the local mail sink, so invitations work in a lab with no mail server. */
export const CapturedMail = z
  .object({
    id: z.string(),
    receivedAt: z.iso.datetime(),
    from: z.string(),
    to: z.array(z.string()),
    subject: z.string(),
    text: z.string(),
  })
  .meta({ id: 'CapturedMail' });
export type CapturedMail = z.infer<typeof CapturedMail>;

export const CapturedMailList = z
  .object({ enabled: z.boolean(), messages: z.array(CapturedMail) })
  .meta({ id: 'CapturedMailList' });
export type CapturedMailList = z.infer<typeof CapturedMailList>;
