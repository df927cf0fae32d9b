import { z } from 'zod';

/**
 * RFC 9457 problem details, as every API error is written. Clients switch on `type`; `title` is
 * fixed per type; `detail` tells the user how to fix it; `errors` points at bad input fields.
 */
export const problemSchema = z.object({
  type: z.string(),
  title: z.string(),
  status: z.number().int(),
  detail: z.string().optional(),
  instance: z.string().optional(),
  errors: z.array(z.object({ pointer: z.string(), detail: z.string() })).optional(),
});

export type Problem = z.infer<typeof problemSchema>;

/** The catalogue of problem types: the one place their `type` URIs and titles are defined. */
export const problemTypes = {
  notFound: { type: '/problems/not-found', title: 'Not found', status: 404 },
  invalidInput: { type: '/problems/invalid-input', title: 'The request has invalid fields', status: 400 },
  unauthenticated: { type: '/problems/unauthenticated', title: 'Sign-in required', status: 401 },
  forbidden: { type: '/problems/forbidden', title: 'Not allowed for your role', status: 403 },
  conflict: { type: '/problems/conflict', title: 'Conflicts with the current state', status: 409 },
  tooManyAttempts: { type: '/problems/too-many-attempts', title: 'Too many attempts', status: 429 },
  payloadTooLarge: { type: '/problems/payload-too-large', title: 'The request is too large', status: 413 },
  unsupportedMediaType: {
    type: '/problems/unsupported-media-type',
    title: 'The request body is in a form the server does not read',
    status: 415,
  },
  unavailable: { type: '/problems/unavailable', title: 'A service the request needs is unavailable', status: 503 },
  internal: { type: '/problems/internal', title: 'Something went wrong on our side', status: 500 },
} as const;

export type ProblemKind = keyof typeof problemTypes;
