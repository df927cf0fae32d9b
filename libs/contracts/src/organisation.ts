import { z } from 'zod';

/** GET /api/organisation: the utility's name and the time zone screens state times in when no single series sets one. */
export const organisationSchema = z.object({
  name: z.string(),
  /** IANA time zone of the organisation (UTC when no organisation is set up yet). */
  timeZone: z.string(),
});

export type Organisation = z.infer<typeof organisationSchema>;
