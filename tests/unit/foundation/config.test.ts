import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readConfig } from '@/lib/config/environment';

describe('server configuration from the environment', () => {
  it('defaults to ./storage, the database inside it, 127.0.0.1 and port 3000', () => {
    expect(readConfig({})).toEqual({
      storageDir: path.resolve('storage'),
      databasePath: path.resolve('storage', 'splitfield.sqlite'),
      host: '127.0.0.1',
      port: 3000,
    });
  });

  it('puts the default database in the chosen storage folder, unless given its own path', () => {
    expect(readConfig({ SPLITFIELD_STORAGE: '/srv/sf' }).databasePath).toBe('/srv/sf/splitfield.sqlite');
    expect(readConfig({ SPLITFIELD_STORAGE: '/srv/sf', SPLITFIELD_DB: '/var/db/sf.sqlite' }).databasePath).toBe(
      '/var/db/sf.sqlite',
    );
  });

  it('reads host and port', () => {
    expect(readConfig({ HOST: '0.0.0.0', PORT: '8080' })).toMatchObject({ host: '0.0.0.0', port: 8080 });
  });

  it.each(['abc', '0', '70000', '80.5'])('names PORT when it is %s', (port) => {
    expect(() => readConfig({ PORT: port })).toThrow(/Invalid environment variable: PORT/);
  });
});
