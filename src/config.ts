/**
 * Typed configuration from the environment: one schema, validated at start-up. A bad setting
 * stops the service with a message naming it. Every setting has an embedded default, so the
 * service runs with no environment at all.
 */
import { Ajv } from 'ajv';
import { Type, type Static } from 'typebox';

export const ConfigSchema = Type.Object({
  HOST: Type.String({ default: '127.0.0.1', minLength: 1, description: 'Address to listen on (0.0.0.0 in the container image).' }),
  PORT: Type.Integer({ default: 3000, minimum: 0, maximum: 65535, description: 'TCP port.' }),
  LOG_LEVEL: Type.Unsafe<'fatal' | 'error' | 'warn' | 'info' | 'debug' | 'trace' | 'silent'>({ type: 'string', enum: ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'], default: 'info', description: 'pino log level.' }),
  BODY_LIMIT: Type.Integer({ default: 1048576, minimum: 1024, maximum: 104857600, description: 'Largest request body, bytes.' }),
  SHUTDOWN_TIMEOUT_MS: Type.Integer({ default: 10000, minimum: 0, maximum: 600000, description: 'Longest wait for in-flight requests on SIGTERM before exiting.' }),
  DOCS: Type.Boolean({ default: true, description: 'Serve the reference page at /docs.' }),
  BATCH_MAX_ITEMS: Type.Integer({ default: 100000, minimum: 1, maximum: 10000000, description: 'Most items in one batch, JSON or NDJSON.' }),
  BATCH_BODY_LIMIT: Type.Integer({ default: 67108864, minimum: 1024, maximum: 1073741824, description: 'Largest JSON batch body, and largest NDJSON stream, bytes.' }),
  BATCH_MAX_LINE: Type.Integer({ default: 65536, minimum: 256, maximum: 16777216, description: 'Longest NDJSON line (one item), bytes.' }),
});
export type Config = Static<typeof ConfigSchema>;

export const CONFIG_DEFAULTS: Config = {
  HOST: '127.0.0.1',
  PORT: 3000,
  LOG_LEVEL: 'info',
  BODY_LIMIT: 1048576,
  SHUTDOWN_TIMEOUT_MS: 10000,
  DOCS: true,
  BATCH_MAX_ITEMS: 100000,
  BATCH_BODY_LIMIT: 67108864,
  BATCH_MAX_LINE: 65536,
};

export class ConfigError extends Error {}

/** Reads the settings this schema names from `env`; throws ConfigError naming each bad one. */
export function loadConfig(env: Record<string, string | undefined>): Config {
  const ajv = new Ajv({ coerceTypes: true, useDefaults: true, allErrors: true, strict: false });
  const validate = ajv.compile(ConfigSchema);
  const picked: Record<string, unknown> = {};
  for (const key of Object.keys(ConfigSchema.properties)) {
    const v = env[key];
    if (v !== undefined && v !== '') picked[key] = v;
  }
  if (!validate(picked)) {
    const msgs = (validate.errors ?? []).map((e) => `${e.instancePath.slice(1) || 'config'} ${e.message ?? 'is not valid'}`);
    throw new ConfigError(`Invalid configuration: ${msgs.join('; ')}`);
  }
  return { ...CONFIG_DEFAULTS, ...(picked as Partial<Config>) };
}
