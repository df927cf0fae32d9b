import { describe, expect, it } from 'vitest';
import { personStatus } from './person-status';

describe('personStatus', () => {
  it('reads an active person with a password as active', () => {
    expect(personStatus({ active: true, invitePending: false }).label).toBe('Active');
  });

  it('reads an active person without a password as invite pending', () => {
    expect(personStatus({ active: true, invitePending: true }).kind).toBe('invite-pending');
  });

  it('reads a deactivated person as deactivated even with an invite outstanding', () => {
    expect(personStatus({ active: false, invitePending: true }).label).toBe('Deactivated');
  });
});
