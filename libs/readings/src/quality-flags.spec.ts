import { qualityFlagBits, qualityFlagsOf } from '@loadwright/contracts';
import { qualityFlag } from '@loadwright/db';
import { describe, expect, it } from 'vitest';

describe('quality flags shared with the web app', () => {
  it('are the same bits as the database schema', () => {
    expect(qualityFlagBits).toEqual(qualityFlag);
  });

  it('are named from a bit field in bit order', () => {
    expect(qualityFlagsOf(0)).toEqual([]);
    expect(qualityFlagsOf(qualityFlag.estimated | qualityFlag.spike | qualityFlag.excluded)).toEqual(['estimated', 'spike', 'excluded']);
  });
});
