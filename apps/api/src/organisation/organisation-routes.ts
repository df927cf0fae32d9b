/** The organisation as every signed-in screen needs it: its name and its time zone. */
import { organisationSchema } from '@loadwright/contracts';
import { organisation } from '@loadwright/db';
import type { AppContext } from '../app-context';
import { defineRoute, type RouteDefinition } from '../http/route-table';

/** The routes under /api/organisation. */
export function organisationRoutes({ db }: AppContext): RouteDefinition[] {
  return [
    defineRoute({
      method: 'get',
      path: '/organisation',
      access: 'data.read',
      tag: 'Organisation',
      summary: "The organisation's name and time zone, in which screens state times that belong to no single series",
      response: organisationSchema,
      handler: async () => {
        const [row] = await db.select({ name: organisation.name, timeZone: organisation.timeZone }).from(organisation).limit(1);
        return row ?? { name: 'Loadwright', timeZone: 'UTC' };
      },
    }),
  ];
}
