import { describe, expect, it } from 'vitest';
import { ConfigError, loadConfig } from './config';

describe('loadConfig', () => {
  it('applies defaults to an empty environment', () => {
    const config = loadConfig({});
    expect(config).toMatchObject({ HOST: '127.0.0.1', PORT: 4280, WORKER_CONCURRENCY: 6, WORKER_PROCESSES: 1, LOG_LEVEL: 'info' });
    expect(config.DATABASE_URL).toBeUndefined();
  });

  it('coerces numbers and keeps valid URLs', () => {
    const config = loadConfig({ PORT: '8080', DATABASE_URL: 'postgres://u@127.0.0.1:5432/db', SMTP_URL: 'smtp://127.0.0.1:2525' });
    expect(config.PORT).toBe(8080);
    expect(config.DATABASE_URL).toBe('postgres://u@127.0.0.1:5432/db');
  });

  it('names every bad variable with what it needs and what it got', () => {
    const attempt = () => loadConfig({ PORT: 'eighty', WORKER_PROCESSES: '0', DATABASE_URL: 'mysql://x', LOG_LEVEL: 'loud' });
    expect(attempt).toThrow(ConfigError);
    const message = (() => {
      try {
        attempt();
        return '';
      } catch (e) {
        return (e as Error).message;
      }
    })();
    expect(message).toContain('PORT must be a whole number from 1 to 65535 (got "eighty")');
    expect(message).toContain('WORKER_PROCESSES must be at least 1 (got "0")');
    expect(message).toContain('DATABASE_URL must be a postgres:// URL');
    expect(message).toContain('LOG_LEVEL must be one of');
  });
});
