/**
 * Delivery of one sent-mail log row, as the 'send-mail' job does it: the row is locked while it is
 * handed to the mail server, so two deliveries of one message cannot overlap, and a row already sent
 * is never sent again (a retried or duplicated job is harmless).
 */
import type pg from 'pg';
import type { Mailer } from './mailer';

/** What became of one delivery attempt. */
export type DeliveryOutcome = 'sent' | 'already-done' | 'missing';

/** Where the attempt stands in its job's retries. */
export interface Attempt {
  retryCount: number;
  retryLimit: number;
}

/**
 * Sends log row `messageId` through `mailer` and marks it sent. On failure the row keeps the error and
 * stays queued (or becomes failed on the job's last attempt), and the error is thrown for the queue
 * to retry.
 */
export async function deliverMail(pool: pg.Pool, mailer: Mailer, messageId: number, attempt: Attempt): Promise<DeliveryOutcome> {
  const client = await pool.connect();
  try {
    await client.query('begin');
    const { rows } = await client.query<{ recipient: string; subject: string; text: string; html: string; status: string }>(
      'select recipient, subject, text, html, status from mail_messages where id = $1 for update',
      [messageId],
    );
    const row = rows[0];
    if (!row || row.status !== 'queued') {
      await client.query('commit');
      return row ? 'already-done' : 'missing';
    }
    try {
      await mailer.send({ to: row.recipient, subject: row.subject, text: row.text, html: row.html });
    } catch (error) {
      const message = error instanceof Error ? error.message : String(error);
      const last = attempt.retryCount >= attempt.retryLimit;
      await client.query(
        `update mail_messages set attempts = attempts + 1, last_attempt_at = now(), last_error = $2,
                status = case when $3 then 'failed'::mail_status else status end
          where id = $1`,
        [messageId, message.slice(0, 500), last],
      );
      await client.query('commit');
      throw error;
    }
    await client.query(
      `update mail_messages set attempts = attempts + 1, last_attempt_at = now(), status = 'sent', sent_at = now() where id = $1`,
      [messageId],
    );
    await client.query('commit');
    return 'sent';
  } catch (error) {
    await client.query('rollback').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}

/**
 * Log rows still queued with no live job (queued before any worker created the queue, or whose job
 * expired with a worker that died): their ids, for the sweep to queue again.
 */
export async function strandedMail(pool: pg.Pool, queue: string): Promise<number[]> {
  const installed = await pool.query<{ ok: boolean }>(`select to_regclass('pgboss.job') is not null as ok`);
  if (!installed.rows[0]?.ok) return [];
  const { rows } = await pool.query<{ id: string }>(
    `select m.id from mail_messages m
      where m.status = 'queued' and m.queued_at < now() - interval '5 seconds'
        and not exists (select 1 from pgboss.job j where j.name = $1 and j.state < 'completed' and j.singleton_key = 'mail-' || m.id)
      order by m.id limit 500`,
    [queue],
  );
  return rows.map((row) => Number(row.id));
}
