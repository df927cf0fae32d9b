import type { UploadDetail, UploadStatus } from '@loadwright/contracts';
import { of } from 'rxjs';
import { TestScheduler } from 'rxjs/testing';
import { describe, expect, it } from 'vitest';
import { followImport, isFinished } from './follow-import';

/** An upload detail with only status and progress filled in. */
const at = (status: UploadStatus, progress: number) => ({ upload: { status, progress } }) as UploadDetail;

describe('followImport', () => {
  it('polls each period and stops after the answer that says done', () => {
    const scheduler = new TestScheduler((actual, expected) => expect(actual).toEqual(expected));
    scheduler.run(({ expectObservable }) => {
      const answers = [at('queued', 0), at('importing', 40), at('importing', 90), at('done', 100), at('done', 100)];
      let calls = 0;
      const polled = followImport(() => of(answers[calls++]!), 10, scheduler);
      expectObservable(polled).toBe('a 9ms b 9ms c 9ms (d|)', { a: answers[0], b: answers[1], c: answers[2], d: answers[3] });
    });
  });

  it('stops on failure as on success, and stops when unsubscribed', () => {
    const scheduler = new TestScheduler((actual, expected) => expect(actual).toEqual(expected));
    scheduler.run(({ expectObservable }) => {
      expectObservable(followImport(() => of(at('failed', 0)), 10, scheduler)).toBe('(a|)', { a: at('failed', 0) });
      let calls = 0;
      const polled = followImport(
        () => {
          calls++;
          return of(at('importing', 10));
        },
        10,
        scheduler,
      );
      expectObservable(polled, '^ 25ms !').toBe('a 9ms a 9ms a', { a: at('importing', 10) });
      scheduler.flush();
      expect(calls).toBe(3);
    });
  });
});

describe('isFinished', () => {
  it('is true only for done and failed', () => {
    expect(['received', 'queued', 'importing', 'done', 'failed'].map((s) => isFinished(s as UploadStatus))).toEqual([
      false,
      false,
      false,
      true,
      true,
    ]);
  });
});
