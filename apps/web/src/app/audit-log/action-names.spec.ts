import { describe, expect, it } from 'vitest';
import { actionName, actorName, detailSummary, targetName } from './action-names';

describe('actionName', () => {
  it('names the actions the API records today', () => {
    expect(actionName('session.sign_in_failed')).toBe('Sign-in failed');
    expect(actionName('token.revoked')).toBe('Revoked an API token');
  });

  it('spells out a code it does not know yet', () => {
    expect(actionName('upload.imported')).toBe('Upload imported');
    expect(actionName('forecast.version_approved')).toBe('Forecast version approved');
  });
});

describe('actorName', () => {
  it('names a person, a token and the system', () => {
    expect(actorName({ kind: 'user', id: 3, name: 'Ines Calloway' })).toBe('Ines Calloway');
    expect(actorName({ kind: 'user', id: null, name: null })).toBe('Someone not signed in');
    expect(actorName({ kind: 'token', id: 7, name: 'Dispatch pull' })).toBe('API token Dispatch pull');
    expect(actorName({ kind: 'visitor', id: null, name: null })).toBe('Not signed in');
    expect(actorName({ kind: 'system', id: null, name: null })).toBe('Loadwright (automatic)');
  });
});

describe('detailSummary', () => {
  it('shows changes as from → to and plain values as they are', () => {
    expect(detailSummary({ role: { from: 'viewer', to: 'planner' }, email: 'a@b.example' })).toBe(
      'role: viewer → planner · email: a@b.example',
    );
    expect(detailSummary({})).toBe('');
  });
});

describe('targetName', () => {
  it('names targets by their names, never "Person #5"', () => {
    expect(targetName({ targetType: 'user', targetId: '5', targetName: 'Dana Reyes' })).toBe('Person: Dana Reyes');
    expect(targetName({ targetType: 'api_token', targetId: '1', targetName: 'dispatch tool' })).toBe('API token: dispatch tool');
    expect(targetName({ targetType: 'forecast_version', targetId: '12', targetName: 'version 12 of North zone' })).toBe(
      'Forecast: version 12 of North zone',
    );
    expect(targetName({ targetType: 'user', targetId: '8', targetName: null })).toBe('Person 8 (no longer listed)');
    expect(targetName({ targetType: null, targetId: null, targetName: null })).toBeNull();
  });
});
