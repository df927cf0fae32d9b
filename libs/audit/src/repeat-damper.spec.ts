import { describe, expect, it } from 'vitest';
import { createRepeatDamper } from './repeat-damper';

describe('createRepeatDamper', () => {
  it('writes the first event of a key, folds repeats inside the window and reports them with the next write', () => {
    const damper = createRepeatDamper({ windowMs: 1_000 });
    expect(damper.decide('token 1', 0)).toEqual({ record: true, repeatsSinceLast: 0 });
    expect(damper.decide('token 1', 10)).toEqual({ record: false, repeatsSinceLast: 1 });
    expect(damper.decide('token 1', 999)).toEqual({ record: false, repeatsSinceLast: 2 });
    // Another key is independent.
    expect(damper.decide('token 2', 999)).toEqual({ record: true, repeatsSinceLast: 0 });
    // 1,000 ms after the first write the window has passed: written, carrying the two folded repeats.
    expect(damper.decide('token 1', 1_000)).toEqual({ record: true, repeatsSinceLast: 2 });
    expect(damper.decide('token 1', 1_001)).toEqual({ record: false, repeatsSinceLast: 1 });
  });

  it('forgets the least recently written key beyond its capacity', () => {
    const damper = createRepeatDamper({ windowMs: 1_000, maxKeys: 2 });
    damper.decide('a', 0);
    damper.decide('b', 0);
    damper.decide('c', 0); // forgets a
    expect(damper.decide('a', 1).record).toBe(true);
    expect(damper.decide('c', 1).record).toBe(false);
  });
});
