/**
 * The steward's answer to an import that stopped to ask how to read repeated daylight-saving hours
 * (status awaiting_choice): the choices join the upload's settings and the import is queued again,
 * in one transaction with its audit entry.
 */
import { eq } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/node-postgres';
import {
  idParamsSchema,
  repeatedHourChoicesRequestSchema,
  uploadSchema,
  type RepeatedHourQuestion,
  type UploadSettings,
} from '@loadwright/contracts';
import { uploads } from '@loadwright/db';
import { recordAudit } from '@loadwright/audit';
import { HttpProblem } from '@loadwright/problems';
import { enqueueImport, findUpload, importQueueReady, settingsWithChoices } from '@loadwright/intake';
import type { AppContext } from '../app-context';
import { clientAddress } from '../auth/client-address';
import { defineRoute, type RouteDefinition } from '../http/route-table';

/** POST /api/uploads/:id/repeated-hours. */
export function repeatedHourRoutes(context: AppContext): RouteDefinition[] {
  const { db, pool } = context;
  return [
    defineRoute({
      method: 'post',
      path: '/uploads/:id/repeated-hours',
      access: 'data.upload',
      tag: 'Uploads',
      summary:
        'Choose how to read each repeated daylight-saving hour an import stopped to ask about (first is daylight time, second is daylight time, or drop); the import resumes with the choices',
      params: idParamsSchema,
      body: repeatedHourChoicesRequestSchema,
      response: uploadSchema,
      handler: async ({ params, body, actor, req }) => {
        const [row] = await db
          .select({ status: uploads.status, settings: uploads.settings, questions: uploads.repeatedHourQuestions })
          .from(uploads)
          .where(eq(uploads.id, params.id));
        if (!row) throw new HttpProblem('notFound', `No upload with id ${params.id}.`);
        if (row.status !== 'awaiting_choice')
          throw new HttpProblem('conflict', `Upload ${params.id} is ${row.status}; only an upload awaiting a choice takes one.`);
        const chosen = settingsWithChoices(
          row.settings as UploadSettings,
          (row.questions ?? []) as unknown as RepeatedHourQuestion[],
          body.choices,
        );
        if (!chosen.ok)
          throw new HttpProblem('invalidInput', chosen.message, [
            { pointer: chosen.index === null ? '/choices' : `/choices/${chosen.index}`, detail: chosen.message },
          ]);
        if (!(await importQueueReady(pool)))
          throw new HttpProblem('unavailable', 'The import queue is not running: start a worker (npm start runs one) and choose again.');
        const client = await pool.connect();
        try {
          await client.query('begin');
          const updated = await client.query(
            `update uploads set status = 'queued', settings = $2, repeated_hour_questions = null, updated_at = now()
              where id = $1 and status = 'awaiting_choice'`,
            [params.id, JSON.stringify(chosen.settings)],
          );
          if (updated.rowCount !== 1) throw new HttpProblem('conflict', `Upload ${params.id} was answered or cancelled meanwhile.`);
          await enqueueImport(client, params.id);
          await recordAudit(drizzle(client), {
            actor,
            action: 'upload.repeated-hours-chosen',
            targetType: 'upload',
            targetId: params.id,
            detail: { choices: body.choices.map(({ seriesKey, local, choice }) => `${seriesKey} ${local}: ${choice}`) },
            ip: clientAddress(req),
          });
          await client.query('commit');
        } catch (error) {
          await client.query('rollback');
          throw error;
        } finally {
          client.release();
        }
        return (await findUpload(db, params.id))!;
      },
    }),
  ];
}
