/**
 * Typed configuration from the environment: one schema, validated at start-up. A bad setting
 * stops the service with a message naming it. Every setting has an embedded default, so the
 * service runs with no environment at all; the README's Configuration table lists the same
 * settings and defaults (a test keeps the two in step).
 */
import { isIP } from 'node:net';
import { Ajv, type ErrorObject } from 'ajv';
import { lazyValidator } from './plugins/lazy-compile.js';
import { Type, type Static } from 'typebox';

const SHA256_HEX_LIST = '^\\s*([0-9a-fA-F]{64}\\s*(,\\s*[0-9a-fA-F]{64}\\s*)*)?$';

export const ConfigSchema = Type.Object(
  {
    HOST: Type.String({ default: '127.0.0.1', minLength: 1, description: 'Address to listen on (0.0.0.0 in the container image).' }),
    PORT: Type.Integer({ default: 3000, minimum: 0, maximum: 65535, description: 'TCP port.' }),
    LOG_LEVEL: Type.Unsafe<'fatal' | 'error' | 'warn' | 'info' | 'debug' | 'trace' | 'silent'>({ type: 'string', enum: ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], default: 'info', description: 'pino log level.' }),
    BODY_LIMIT: Type.Integer({ default: 1048576, minimum: 1024, maximum: 104857600, description: 'Largest request body, bytes.' }),
    BODY_HOLD_BYTES: Type.Integer({ default: 0, minimum: 0, maximum: 68719476736, description: 'Most bytes of request bodies held at once (arriving, waiting or being answered; NDJSON streams hold none); a body past it is read, dropped and answered 503 with Retry-After, though one body is always taken when none is held. 0: an eighth of the JavaScript heap limit.' }),
    JSON_MAX_DEPTH: Type.Integer({ default: 32, minimum: 4, maximum: 1000, description: 'Deepest nesting of arrays and objects in a JSON body.' }),
    REQUEST_TIMEOUT_MS: Type.Integer({ default: 30000, minimum: 100, maximum: 3600000, description: 'Longest time to receive and answer one request (the batch route has its own).' }),
    BATCH_TIMEOUT_MS: Type.Integer({ default: 300000, minimum: 100, maximum: 3600000, description: 'Longest time to receive and answer one batch request, NDJSON streams included.' }),
    DRAIN_DELAY_MS: Type.Integer({ default: 5000, minimum: 0, maximum: 600000, description: 'After SIGTERM: how long the service keeps answering (readiness already 503) before it closes its listener.' }),
    SHUTDOWN_TIMEOUT_MS: Type.Integer({ default: 10000, minimum: 0, maximum: 600000, description: 'After the drain delay: longest wait for in-flight requests before exiting.' }),
    DOCS: Type.Boolean({ default: true, description: 'Serve the reference page at /docs.' }),
    BATCH_MAX_ITEMS: Type.Integer({ default: 100000, minimum: 1, maximum: 10000000, description: 'Most items in one batch, JSON or NDJSON.' }),
    BATCH_BODY_LIMIT: Type.Integer({ default: 67108864, minimum: 1024, maximum: 1073741824, description: 'Largest JSON batch body, and largest NDJSON stream, bytes.' }),
    BATCH_CONCURRENCY: Type.Integer({ default: 2, minimum: 1, maximum: 64, description: 'JSON-array batches computed at once; the others wait their turn in arrival order, holding only their body text.' }),
    BATCH_MAX_LINE: Type.Integer({ default: 65536, minimum: 256, maximum: 16777216, description: 'Longest NDJSON line (one item), bytes.' }),
    API_KEY_HASHES: Type.String({ default: '', pattern: SHA256_HEX_LIST, description: 'Comma list of SHA-256 hashes (64 hex digits) of the accepted API keys; empty turns authentication off.' }),
    METRICS: Type.Boolean({ default: true, description: 'Serve Prometheus metrics at /metrics.' }),
    METRICS_REQUIRE_KEY: Type.Boolean({ default: false, description: '/metrics needs an API key too (needs API_KEY_HASHES).' }),
    CORS_ORIGINS: Type.String({ default: '', maxLength: 8192, description: 'Comma list of browser origins (scheme://host[:port]) allowed to call the service; empty turns CORS off.' }),
    RATE_LIMIT_MAX: Type.Integer({ default: 0, minimum: 0, maximum: 100000000, description: 'Requests per window per API key (or per client address without a key); 0 turns rate limiting off.' }),
    RATE_LIMIT_WINDOW_MS: Type.Integer({ default: 60000, minimum: 1000, maximum: 86400000, description: 'Rate-limit window, milliseconds.' }),
    TRUST_PROXY: Type.String({ default: 'false', minLength: 1, maxLength: 4096, description: 'Whom to believe in X-Forwarded-For/-Proto: false, true, a hop count, or a comma list of proxy addresses/CIDRs.' }),
    OVERLOAD_EVENT_LOOP_DELAY_MS: Type.Integer({ default: 1000, minimum: 0, maximum: 600000, description: 'Mean event-loop delay above which the service reports unready and sheds new work with 503; 0 turns shedding off.' }),
    CHROMIUM_PATH: Type.String({ default: '', maxLength: 4096, description: 'Headless Chromium for format=pdf sheets; empty: look in the usual places (/usr/bin/chromium, /usr/bin/chromium-browser). Without one, format=pdf answers 501.' }),
  },
  { additionalProperties: false },
);
export type Config = Static<typeof ConfigSchema>;

export const CONFIG_DEFAULTS: Config = {
  HOST: '127.0.0.1',
  PORT: 3000,
  LOG_LEVEL: 'info',
  BODY_LIMIT: 1048576,
  BODY_HOLD_BYTES: 0,
  JSON_MAX_DEPTH: 32,
  REQUEST_TIMEOUT_MS: 30000,
  BATCH_TIMEOUT_MS: 300000,
  DRAIN_DELAY_MS: 5000,
  SHUTDOWN_TIMEOUT_MS: 10000,
  DOCS: true,
  BATCH_MAX_ITEMS: 100000,
  BATCH_BODY_LIMIT: 67108864,
  BATCH_MAX_LINE: 65536,
  BATCH_CONCURRENCY: 2,
  API_KEY_HASHES: '',
  METRICS: true,
  METRICS_REQUIRE_KEY: false,
  CORS_ORIGINS: '',
  RATE_LIMIT_MAX: 0,
  RATE_LIMIT_WINDOW_MS: 60000,
  TRUST_PROXY: 'false',
  OVERLOAD_EVENT_LOOP_DELAY_MS: 1000,
  CHROMIUM_PATH: '',
};

export class ConfigError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ConfigError';
  }
}

const common = { useDefaults: false, allErrors: true, strict: false } as const;
/** Environment strings, each setting optional: numbers and booleans are coerced ("3000", "true"). */
// validateSchema off: the schema is ours and fixed (the contract tests check it); checking it
// against the meta-schema at every start cost about 70 ms of the time to ready.
const validateEnv = lazyValidator(() => new Ajv({ ...common, coerceTypes: true, validateSchema: false }).compile(Type.Partial(ConfigSchema)));
/** Settings given in code (buildApp options): the types must already be right. */
const validateTyped = lazyValidator(() => new Ajv({ ...common, coerceTypes: false, validateSchema: false }).compile(ConfigSchema));

function describe(errors: ErrorObject[] | null | undefined): string[] {
  return (errors ?? []).map((e) => {
    const name = e.instancePath.slice(1) || (e.params as { additionalProperty?: string }).additionalProperty || 'config';
    if (e.keyword === 'pattern' && name === 'API_KEY_HASHES') return `${name} must be a comma list of SHA-256 hashes, 64 hex digits each`;
    if (e.keyword === 'additionalProperties') return `${name} is not a setting`;
    return `${name} ${e.message ?? 'is not valid'}`;
  });
}

/** Checks that involve more than one setting, or a value's inner structure. */
function crossCheck(c: Config): string[] {
  const out: string[] = [];
  if (c.METRICS_REQUIRE_KEY && apiKeyHashes(c).length === 0) out.push('METRICS_REQUIRE_KEY=true needs API_KEY_HASHES (no key could ever open /metrics)');
  if (c.BATCH_MAX_LINE > c.BATCH_BODY_LIMIT) out.push('BATCH_MAX_LINE must not exceed BATCH_BODY_LIMIT');
  if (c.REQUEST_TIMEOUT_MS > c.BATCH_TIMEOUT_MS) out.push('REQUEST_TIMEOUT_MS must not exceed BATCH_TIMEOUT_MS');
  for (const o of listOf(c.CORS_ORIGINS)) {
    if (!isOrigin(o)) out.push(`CORS_ORIGINS entry "${o}" is not an origin such as https://tools.example.com (scheme, host and optional port; no path, no wildcard)`);
  }
  try {
    trustProxy(c);
  } catch (err) {
    out.push((err as Error).message);
  }
  return out;
}

/** Reads the settings this schema names from `env`; throws ConfigError naming each bad one. */
export function loadConfig(env: Record<string, string | undefined>): Config {
  const picked: Record<string, unknown> = {};
  for (const key of Object.keys(ConfigSchema.properties)) {
    const v = env[key];
    if (v !== undefined && v !== '') picked[key] = v;
  }
  if (!validateEnv(picked)) throw new ConfigError(`Invalid configuration: ${describe(validateEnv.errors).join('; ')}`);
  const config = { ...CONFIG_DEFAULTS, ...(picked as Partial<Config>) };
  const problems = crossCheck(config);
  if (problems.length > 0) throw new ConfigError(`Invalid configuration: ${problems.join('; ')}`);
  return config;
}

/** Defaults overlaid with settings given in code; validated the same way as the environment. */
export function resolveConfig(partial: Partial<Config> = {}): Config {
  const config = { ...CONFIG_DEFAULTS, ...partial };
  if (!validateTyped(config)) throw new ConfigError(`Invalid configuration: ${describe(validateTyped.errors).join('; ')}`);
  const problems = crossCheck(config);
  if (problems.length > 0) throw new ConfigError(`Invalid configuration: ${problems.join('; ')}`);
  return config;
}

function listOf(value: string): string[] {
  return value
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
}

function isOrigin(value: string): boolean {
  try {
    const u = new URL(value);
    return (u.protocol === 'https:' || u.protocol === 'http:') && u.origin === value;
  } catch {
    return false;
  }
}

/** The accepted key hashes, lower-case, without duplicates. */
export function apiKeyHashes(c: Pick<Config, 'API_KEY_HASHES'>): string[] {
  return [...new Set(listOf(c.API_KEY_HASHES).map((h) => h.toLowerCase()))];
}

/** The allowed browser origins, exactly as a browser sends them in the Origin header. */
export function corsOrigins(c: Pick<Config, 'CORS_ORIGINS'>): string[] {
  return [...new Set(listOf(c.CORS_ORIGINS))];
}

/** TRUST_PROXY as Fastify's trustProxy option; throws on a value it cannot read. */
export function trustProxy(c: Pick<Config, 'TRUST_PROXY'>): boolean | number | string[] {
  const v = c.TRUST_PROXY.trim();
  if (v === 'false') return false;
  if (v === 'true') return true;
  if (/^\d+$/.test(v)) return Number(v);
  const list = listOf(v);
  for (const entry of list) {
    const [addr, bits, extra] = entry.split('/');
    const family = isIP(addr ?? '');
    const okBits = bits === undefined || (/^\d+$/.test(bits) && Number(bits) <= (family === 6 ? 128 : 32));
    if (family === 0 || !okBits || extra !== undefined) {
      throw new ConfigError(`TRUST_PROXY entry "${entry}" is not true, false, a hop count, or an IP address or CIDR range`);
    }
  }
  return list;
}
