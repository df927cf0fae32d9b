import { describe, expect, it } from 'vitest';
import { fileSize } from './upload-status';

describe('fileSize', () => {
  it('reads bytes, kB and MB in powers of 1024', () => {
    expect(fileSize(512)).toBe('512 B');
    expect(fileSize(1536)).toBe('1.5 kB');
    expect(fileSize(5 * 1024 * 1024)).toBe('5.0 MB');
  });
});
