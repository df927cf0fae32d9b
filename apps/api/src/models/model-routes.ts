/**
 * Model settings per series (GET/PUT /api/series/:id/model), the newest fit with what `auto` compared
 * (GET /api/series/:id/fit), and the organisation's holiday calendar (/api/holidays).
 */
import {
  createHolidayRequestSchema,
  fitSummarySchema,
  holidayCalendarSchema,
  holidayListQuerySchema,
  modelSettingsRequestSchema,
  modelSettingsSchema,
  seedHolidaysRequestSchema,
  seedHolidaysResultSchema,
  holidaySchema,
  type Holiday,
  idParamsSchema,
} from '@loadwright/contracts';
import { sql } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import type { AppContext } from '../app-context';
import { recordAudit } from '@loadwright/audit';
import { clientAddress } from '../auth/client-address';
import { HttpProblem } from '@loadwright/problems';
import { defineRoute, type RouteDefinition } from '../http/route-table';
import { readHolidayPlace, seedHolidayYears } from '@loadwright/refits';
import { NoModelError, readLatestFit, readModelSettings, writeModelSettings } from '@loadwright/refits';

const idParams = idParamsSchema;

/** The model and holiday routes. */
export function modelRoutes({ db, pool }: AppContext): RouteDefinition[] {
  const settingsOf = async (seriesId: number) => {
    try {
      return await readModelSettings(db, pool, seriesId);
    } catch (error) {
      if (error instanceof NoModelError) throw new HttpProblem('notFound', error.message);
      throw error;
    }
  };

  return [
    defineRoute({
      method: 'get',
      path: '/series/:id/model',
      access: 'data.read',
      tag: 'Models',
      summary: "A load series' model settings (defaults until a planner changes them)",
      params: idParams,
      response: modelSettingsSchema,
      handler: ({ params }) => settingsOf(params.id),
    }),
    defineRoute({
      method: 'put',
      path: '/series/:id/model',
      access: 'models.edit',
      tag: 'Models',
      summary: "Replace a load series' model settings; used from the next refit on",
      params: idParams,
      body: modelSettingsRequestSchema,
      response: modelSettingsSchema,
      handler: async ({ params, body, actor, req }) => {
        const before = await settingsOf(params.id);
        await db.transaction(async (tx) => {
          await writeModelSettings(tx, params.id, body, actor.kind === 'user' ? actor.userId : null);
          const { seriesId: _s, temperatureSeries: _t, updatedAt: _u, updatedBy: _b, ...previous } = before;
          await recordAudit(tx, {
            actor,
            action: 'model.settings_changed',
            targetType: 'series',
            targetId: params.id,
            detail: { before: previous, after: body },
            ip: clientAddress(req),
          });
        });
        return settingsOf(params.id);
      },
    }),
    defineRoute({
      method: 'get',
      path: '/series/:id/fit',
      access: 'data.read',
      tag: 'Models',
      summary: 'The newest fit of a load series: method, coefficients, residual checks and what auto compared',
      params: idParams,
      response: fitSummarySchema,
      handler: async ({ params }) => {
        await settingsOf(params.id);
        const fit = await readLatestFit(pool, params.id);
        if (!fit) throw new HttpProblem('notFound', `Series ${params.id} has not been fitted yet.`);
        return fit;
      },
    }),
    defineRoute({
      method: 'get',
      path: '/holidays',
      access: 'data.read',
      tag: 'Models',
      summary: 'The holiday calendar that feeds the day-type regressors (default: this year and next)',
      query: holidayListQuerySchema,
      response: holidayCalendarSchema,
      handler: async ({ query }) => {
        const year = new Date().getUTCFullYear();
        const from = query.from ?? `${year}-01-01`;
        const to = query.to ?? `${year + 1}-12-31`;
        if (from > to)
          throw new HttpProblem('invalidInput', 'The start date must not be after the end date.', [
            { pointer: '/from', detail: 'after to' },
          ]);
        const place = await readHolidayPlace(pool);
        const { rows } = await pool.query(
          `select id, to_char(day, 'YYYY-MM-DD') as day, name, kind, source, updated_at from holidays where day between $1::date and $2::date order by day, name`,
          [from, to],
        );
        return { country: place.country, region: place.region, holidays: rows.map(holidayOut) };
      },
    }),
    defineRoute({
      method: 'post',
      path: '/holidays',
      access: 'models.edit',
      tag: 'Models',
      summary: 'Add a day to the holiday calendar (e.g. a plant shutdown); counts as a holiday from the next refit on',
      body: createHolidayRequestSchema,
      response: holidaySchema,
      status: 201,
      handler: async ({ body, actor, req }) => {
        return db.transaction(async (tx) => {
          const { rows } = await tx.execute<HolidayRow>(
            sql`insert into holidays (day, name, kind, source, updated_by_id)
                values (${body.day}::date, ${body.name}, ${body.kind}, 'manual', ${actor.kind === 'user' ? actor.userId : null})
                on conflict on constraint holidays_day_name_key do nothing
                returning id, to_char(day, 'YYYY-MM-DD') as day, name, kind, source,
                          to_char(updated_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"') as updated_at`,
          );
          if (rows.length === 0) throw new HttpProblem('conflict', `${body.day} is already in the calendar as "${body.name}".`);
          const holiday = holidayOut(rows[0]!);
          await recordAudit(tx, {
            actor,
            action: 'holiday.added',
            targetType: 'holiday',
            targetId: holiday.id,
            detail: { day: holiday.day, name: holiday.name, kind: holiday.kind },
            ip: clientAddress(req),
          });
          return holiday;
        });
      },
    }),
    defineRoute({
      method: 'post',
      path: '/holidays/seed',
      access: 'models.edit',
      tag: 'Models',
      summary: "Fill the calendar with the public holidays of the organisation's country and region for years not seeded yet",
      body: seedHolidaysRequestSchema,
      response: seedHolidaysResultSchema,
      handler: async ({ body, actor, req }) => {
        const place = await readHolidayPlace(pool);
        if (!place.country)
          throw new HttpProblem('conflict', 'The organisation has no holiday country set; an admin sets it in the settings.');
        // The days and their audit entry are committed together.
        const client = await pool.connect();
        try {
          await client.query('begin');
          const added = await seedHolidayYears(client, place, body.years);
          await recordAudit(drizzle(client), {
            actor,
            action: 'holiday.seeded',
            targetType: 'holiday',
            detail: { years: body.years, added, country: place.country, region: place.region },
            ip: clientAddress(req),
          });
          await client.query('commit');
          return { added };
        } catch (error) {
          await client.query('rollback');
          throw error;
        } finally {
          client.release();
        }
      },
    }),
    defineRoute({
      method: 'delete',
      path: '/holidays/:id',
      access: 'models.edit',
      tag: 'Models',
      summary: 'Remove a day from the holiday calendar',
      params: idParams,
      handler: async ({ params, actor, req }) => {
        await db.transaction(async (tx) => {
          const { rows } = await tx.execute(
            sql`delete from holidays where id = ${params.id} returning to_char(day, 'YYYY-MM-DD') as day, name, source`,
          );
          if (rows.length === 0) throw new HttpProblem('notFound', `No holiday with id ${params.id}.`);
          await recordAudit(tx, {
            actor,
            action: 'holiday.removed',
            targetType: 'holiday',
            targetId: params.id,
            detail: rows[0],
            ip: clientAddress(req),
          });
        });
      },
    }),
  ];
}

/** A holidays row as PostgreSQL returns it. */
type HolidayRow = {
  id: number;
  day: string;
  name: string;
  kind: Holiday['kind'];
  source: Holiday['source'];
  updated_at: Date | string;
};

/** A holidays row as the contract shapes it. */
function holidayOut(row: HolidayRow) {
  return {
    id: row.id,
    day: row.day,
    name: row.name,
    kind: row.kind,
    source: row.source,
    // A Date from pg's own parser, or already ISO text from a statement that formats it.
    updatedAt: row.updated_at instanceof Date ? row.updated_at.toISOString() : row.updated_at,
  };
}
