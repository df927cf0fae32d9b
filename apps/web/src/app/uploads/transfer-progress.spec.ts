import '@angular/compiler';
import { HttpEventType, HttpResponse } from '@angular/common/http';
import type { UploadReceipt } from '@loadwright/contracts';
import { describe, expect, it } from 'vitest';
import { transferStep } from './transfer-progress';

describe('transferStep', () => {
  it('turns upload progress into a whole percent', () => {
    expect(transferStep({ type: HttpEventType.Sent })).toEqual({ phase: 'sending', percent: 0, loaded: 0 });
    expect(transferStep({ type: HttpEventType.UploadProgress, loaded: 333, total: 1000 })).toEqual({
      phase: 'sending',
      percent: 33,
      loaded: 333,
    });
  });

  it('says the percent is unknown when the size is', () => {
    expect(transferStep({ type: HttpEventType.UploadProgress, loaded: 5 })).toEqual({ phase: 'sending', percent: null, loaded: 5 });
  });

  it('hands on the receipt of the answer and ignores other events', () => {
    const receipt = { duplicateOf: null, message: null } as UploadReceipt;
    expect(transferStep(new HttpResponse({ body: receipt }))).toEqual({ phase: 'received', receipt });
    expect(transferStep({ type: HttpEventType.ResponseHeader } as never)).toBeNull();
  });
});
