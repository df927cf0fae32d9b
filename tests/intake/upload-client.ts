/** Upload steps as the web app performs them, for the intake tests. */
import type { ConfirmUploadRequest, UploadDetail } from '@loadwright/contracts';
import request from 'supertest';
import type { SignedIn } from '../support/people';

/** Sends a file as multipart/form-data. */
export function postFile(url: string, session: SignedIn, fileName: string, content: Buffer | string) {
  return request(url)
    .post('/api/uploads')
    .set('Cookie', session.cookie)
    .set('X-CSRF-Token', session.csrf)
    .attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content, 'utf8'), fileName);
}

/** Confirms a mapping. */
export function confirm(url: string, session: SignedIn, id: number, body: ConfirmUploadRequest) {
  return request(url).post(`/api/uploads/${id}/mapping`).set('Cookie', session.cookie).set('X-CSRF-Token', session.csrf).send(body);
}

/** Polls an upload until it is done, failed or cancelled, or awaits a choice (or the time runs out). */
export async function waitForImport(url: string, session: SignedIn, id: number, timeoutMs = 60_000): Promise<UploadDetail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const response = await request(url).get(`/api/uploads/${id}`).set('Cookie', session.cookie);
    const detail = response.body as UploadDetail;
    if (['done', 'failed', 'cancelled', 'awaiting_choice'].includes(detail.upload.status)) return detail;
    if (Date.now() > until) throw new Error(`upload ${id} still ${detail.upload.status} after ${timeoutMs} ms`);
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
