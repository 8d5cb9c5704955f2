/**
 * Configuration: one schema for every setting, read from the environment, with defaults; a bad
 * setting stops start-up with a message naming it; the README's table lists the same settings
 * and defaults.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { apiKeyHashes, CONFIG_DEFAULTS, ConfigError, ConfigSchema, corsOrigins, loadConfig, resolveConfig, trustProxy } from '../../src/config.js';
import { buildApp } from '../../src/app.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const HASH_A = 'a'.repeat(64);
const HASH_B = '0123456789abcdef'.repeat(4);

describe('loadConfig', () => {
  it('gives the defaults for an empty environment, and ignores unrelated variables', () => {
    expect(loadConfig({ PATH: '/usr/bin', HOME: '/root' })).toEqual(CONFIG_DEFAULTS);
  });

  it('has a default for every setting the schema names, and no default without a setting', () => {
    expect(Object.keys(CONFIG_DEFAULTS).sort()).toEqual(Object.keys(ConfigSchema.properties).sort());
    for (const [name, schema] of Object.entries(ConfigSchema.properties)) {
      expect((schema as { default?: unknown }).default, name).toEqual(CONFIG_DEFAULTS[name as keyof typeof CONFIG_DEFAULTS]);
    }
  });

  it('reads numbers and booleans from environment strings', () => {
    const c = loadConfig({ PORT: '8080', DOCS: 'false', RATE_LIMIT_MAX: '100', METRICS_REQUIRE_KEY: 'true', API_KEY_HASHES: HASH_A, DRAIN_DELAY_MS: '0' });
    expect(c.PORT).toBe(8080);
    expect(c.DOCS).toBe(false);
    expect(c.RATE_LIMIT_MAX).toBe(100);
    expect(c.METRICS_REQUIRE_KEY).toBe(true);
    expect(c.DRAIN_DELAY_MS).toBe(0);
  });

  it('treats an empty variable as unset', () => {
    expect(loadConfig({ PORT: '', LOG_LEVEL: '' })).toEqual(CONFIG_DEFAULTS);
  });

  const bad: Array<[Record<string, string>, RegExp]> = [
    [{ PORT: 'eighty' }, /PORT must be integer/],
    [{ PORT: '70000' }, /PORT must be <= 65535/],
    [{ LOG_LEVEL: 'loud' }, /LOG_LEVEL must be equal to one of the allowed values/],
    [{ BODY_LIMIT: '10' }, /BODY_LIMIT must be >= 1024/],
    [{ JSON_MAX_DEPTH: '2' }, /JSON_MAX_DEPTH must be >= 4/],
    [{ DOCS: 'perhaps' }, /DOCS must be boolean/],
    [{ REQUEST_TIMEOUT_MS: '5' }, /REQUEST_TIMEOUT_MS must be >= 100/],
    [{ API_KEY_HASHES: 'not-a-hash' }, /API_KEY_HASHES must be a comma list of SHA-256 hashes/],
    [{ API_KEY_HASHES: `${HASH_A},${HASH_A.slice(1)}` }, /API_KEY_HASHES must be a comma list/],
    [{ METRICS_REQUIRE_KEY: 'true' }, /METRICS_REQUIRE_KEY=true needs API_KEY_HASHES/],
    [{ CORS_ORIGINS: 'https://tools.example.com/path' }, /CORS_ORIGINS entry "https:\/\/tools.example.com\/path" is not an origin/],
    [{ CORS_ORIGINS: '*' }, /CORS_ORIGINS entry "\*" is not an origin/],
    [{ CORS_ORIGINS: 'ftp://tools.example.com' }, /CORS_ORIGINS entry/],
    [{ TRUST_PROXY: 'sometimes' }, /TRUST_PROXY entry "sometimes"/],
    [{ TRUST_PROXY: '10.0.0.0/33' }, /TRUST_PROXY entry "10.0.0.0\/33"/],
    [{ RATE_LIMIT_MAX: '-1' }, /RATE_LIMIT_MAX must be >= 0/],
    [{ RATE_LIMIT_WINDOW_MS: '10' }, /RATE_LIMIT_WINDOW_MS must be >= 1000/],
    [{ BATCH_MAX_LINE: '4096', BATCH_BODY_LIMIT: '2048' }, /BATCH_MAX_LINE must not exceed BATCH_BODY_LIMIT/],
    [{ REQUEST_TIMEOUT_MS: '60000', BATCH_TIMEOUT_MS: '1000' }, /REQUEST_TIMEOUT_MS must not exceed BATCH_TIMEOUT_MS/],
  ];
  for (const [env, message] of bad) {
    it(`refuses ${JSON.stringify(env)}, naming the setting`, () => {
      expect(() => loadConfig(env)).toThrow(ConfigError);
      expect(() => loadConfig(env)).toThrow(message);
    });
  }

  it('names every bad setting at once', () => {
    expect(() => loadConfig({ PORT: 'x', LOG_LEVEL: 'y' })).toThrow(/PORT .*; LOG_LEVEL /);
  });
});

describe('settings with structure', () => {
  it('API_KEY_HASHES: a comma list, spaces allowed, case folded, duplicates dropped', () => {
    expect(apiKeyHashes({ API_KEY_HASHES: ` ${HASH_A.toUpperCase()} , ${HASH_B},${HASH_A}` })).toEqual([HASH_A, HASH_B]);
    expect(apiKeyHashes({ API_KEY_HASHES: '' })).toEqual([]);
  });

  it('CORS_ORIGINS: exact origins', () => {
    expect(corsOrigins({ CORS_ORIGINS: 'https://tools.example.com, http://localhost:5173' })).toEqual(['https://tools.example.com', 'http://localhost:5173']);
  });

  it('TRUST_PROXY: false, true, a hop count or addresses', () => {
    expect(trustProxy({ TRUST_PROXY: 'false' })).toBe(false);
    expect(trustProxy({ TRUST_PROXY: 'true' })).toBe(true);
    expect(trustProxy({ TRUST_PROXY: '2' })).toBe(2);
    expect(trustProxy({ TRUST_PROXY: '10.0.0.0/8, 192.168.1.1, ::1' })).toEqual(['10.0.0.0/8', '192.168.1.1', '::1']);
  });
});

describe('settings given in code (buildApp)', () => {
  it('are validated like the environment', async () => {
    expect(() => resolveConfig({ PORT: -1 })).toThrow(/PORT must be >= 0/);
    await expect(buildApp({ config: { DOCS: false, RATE_LIMIT_MAX: 1.5 } })).rejects.toThrow(/RATE_LIMIT_MAX must be integer/);
    await expect(buildApp({ config: { DOCS: false, METRICS_REQUIRE_KEY: true } })).rejects.toThrow(ConfigError);
  });

  it('buildApp with only DOCS: false has no authentication and no rate limit', async () => {
    const app = await buildApp({ config: { DOCS: false } });
    try {
      for (let i = 0; i < 30; i++) {
        const res = await app.inject({ method: 'GET', url: '/v1/catalog/steels' });
        expect(res.statusCode).toBe(200);
        expect(res.headers['x-ratelimit-limit']).toBeUndefined();
      }
    } finally {
      await app.close();
    }
  });
});

describe('README Configuration table', () => {
  const readme = readFileSync(`${ROOT}README.md`, 'utf8');
  const section = readme.slice(readme.indexOf('## Configuration'), readme.indexOf('## Running in production'));
  const rows = new Map<string, string>();
  for (const m of section.matchAll(/^\| `([A-Z_]+)` \| ([^|]*) \|/gm)) rows.set(m[1]!, m[2]!.trim());

  it('lists every setting, and nothing else', () => {
    expect([...rows.keys()].sort()).toEqual(Object.keys(ConfigSchema.properties).sort());
  });

  it('gives each setting its default', () => {
    for (const [name, value] of Object.entries(CONFIG_DEFAULTS)) {
      const shown = rows.get(name)!;
      const expected = value === '' ? '(empty)' : `\`${String(value)}\``;
      expect(shown, name).toBe(expected);
    }
  });
});

describe('start-up with a bad setting', () => {
  it('the server exits with status 78 and a message naming the setting, before listening', () => {
    const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/server.ts'], {
      cwd: ROOT,
      env: { ...process.env, PORT: 'eighty', LOG_LEVEL: 'loud', HOST: '127.0.0.1' },
      encoding: 'utf8',
      timeout: 30000,
    });
    expect(r.status).toBe(78);
    expect(r.stderr).toMatch(/^Throatline cannot start\. Invalid configuration: .*PORT must be integer/);
    expect(r.stderr).toMatch(/LOG_LEVEL must be equal to one of the allowed values/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });
});
