/** Server configuration, read from the environment once at start-up and validated. */
import { z } from 'zod';

const envSchema = z.object({
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'DATABASE_URL must be a postgres:// URL'),
  PORT: z.coerce.number().int().min(0).max(65535).default(8080),
  HOST: z.string().default('127.0.0.1'),
  // Signs session tokens; every instance behind one load balancer must share it.
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must be at least 32 characters'),
  // Set when served over HTTPS so the session cookie is marked Secure.
  COOKIE_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  WEB_DIR: z.string().optional(),
});

export interface Config {
  databaseUrl: string;
  port: number;
  host: string;
  sessionSecret: string;
  cookieSecure: boolean;
  webDir?: string;
}

export function readConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  const e = parsed.data;
  return {
    databaseUrl: e.DATABASE_URL,
    port: e.PORT,
    host: e.HOST,
    sessionSecret: e.SESSION_SECRET,
    cookieSecure: e.COOKIE_SECURE,
    webDir: e.WEB_DIR,
  };
}
