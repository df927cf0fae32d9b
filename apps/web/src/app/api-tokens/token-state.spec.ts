import { describe, expect, it } from 'vitest';
import { tokenState } from './token-state';

const now = new Date('2026-12-02T08:00:00Z');

describe('tokenState', () => {
  it('reads a token without expiry or revocation as active', () => {
    expect(tokenState({ revokedAt: null, expiresAt: null }, now).kind).toBe('live');
  });

  it('reads a token past its expiry as expired, and one expiring later as active', () => {
    expect(tokenState({ revokedAt: null, expiresAt: '2026-12-02T08:00:00.000Z' }, now).kind).toBe('expired');
    expect(tokenState({ revokedAt: null, expiresAt: '2026-12-02T08:00:01.000Z' }, now).kind).toBe('live');
  });

  it('reads a revoked token as revoked even after it expired', () => {
    expect(tokenState({ revokedAt: '2026-11-01T00:00:00.000Z', expiresAt: '2026-11-02T00:00:00.000Z' }, now).label).toBe('Revoked');
  });
});
