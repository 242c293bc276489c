/** The broker process's configuration (scripts/broker.ts), read from the environment once. */
import { z } from 'zod';

import { MQTT_DEFAULT_PORT } from '@/ingest/mqttTopics';

const envSchema = z.object({
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  // Loopback by default, as the HTTP server: opening it to sensors elsewhere is a decision.
  MQTT_HOST: z.string().min(1).default('127.0.0.1'),
  MQTT_PORT: z.coerce.number().int().min(0).max(65535).default(MQTT_DEFAULT_PORT),
  // The server's service account; the same value as the server's MQTT_PASSWORD.
  MQTT_PASSWORD: z.string().min(16, 'MQTT_PASSWORD must be at least 16 characters'),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
});

export interface BrokerConfig {
  databaseUrl: string;
  host: string;
  port: number;
  servicePassword: string;
  logLevel: z.infer<typeof envSchema>['LOG_LEVEL'];
}

export function readBrokerConfig(
  env: Readonly<Record<string, string | undefined>> = process.env,
): BrokerConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    databaseUrl: e.DATABASE_URL,
    host: e.MQTT_HOST,
    port: e.MQTT_PORT,
    servicePassword: e.MQTT_PASSWORD,
    logLevel: e.LOG_LEVEL,
  };
}
