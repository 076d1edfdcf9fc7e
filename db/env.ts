/**
 * The server's settings, read from the environment and checked with zod in one place.
 * Server-side only (scripts import it too, so it carries no `server-only` marker; none of these
 * variables is public, so a client bundle would see them as missing and fail loudly).
 */
import { z } from 'zod';

const url = (name: string) =>
  z
    .string({ error: `${name} is not set` })
    .min(1, { error: `${name} is not set` })
    .refine((value) => URL.canParse(value), { error: `${name} must be a URL` });

const databaseEnvSchema = z.object({
  DATABASE_URL: url('DATABASE_URL').refine((value) => /^mysql:\/\//.test(value), {
    error: 'DATABASE_URL must start with mysql://',
  }),
});

const serverEnvSchema = databaseEnvSchema.extend({
  NEXTAUTH_URL: url('NEXTAUTH_URL'),
  NEXTAUTH_SECRET: z
    .string({ error: 'NEXTAUTH_SECRET is not set' })
    .min(16, { error: 'NEXTAUTH_SECRET must be at least 16 characters' }),
  APP_URL: url('APP_URL'),
  SMTP_HOST: z.string({ error: 'SMTP_HOST is not set' }).min(1, { error: 'SMTP_HOST is not set' }),
  SMTP_PORT: z.coerce
    .number({ error: 'SMTP_PORT must be a number' })
    .int({ error: 'SMTP_PORT must be a whole number' })
    .min(1, { error: 'SMTP_PORT must be from 1 to 65535' })
    .max(65535, { error: 'SMTP_PORT must be from 1 to 65535' }),
  MAIL_WEB_URL: url('MAIL_WEB_URL').optional(),
  MAIL_FROM: z.string({ error: 'MAIL_FROM is not set' }).min(3, { error: 'MAIL_FROM is not set' }),
});

export type DatabaseEnv = z.infer<typeof databaseEnvSchema>;
export type ServerEnv = z.infer<typeof serverEnvSchema>;

function parseOrThrow<T>(schema: z.ZodType<T>, source: NodeJS.ProcessEnv): T {
  const result = schema.safeParse(source);
  if (!result.success) {
    const problems = result.error.issues.map((issue) => `- ${issue.message}`).join('\n');
    throw new Error(`Channelsmith's environment is not valid:\n${problems}\n(see .env.example)`);
  }
  return result.data;
}

/** Only what the database layer and its scripts need (migrate, seed). Read on each call. */
export function getDatabaseEnv(source: NodeJS.ProcessEnv = process.env): DatabaseEnv {
  return parseOrThrow(databaseEnvSchema, source);
}

/** Every server setting; throws a message listing each missing or malformed variable. */
export function getServerEnv(source: NodeJS.ProcessEnv = process.env): ServerEnv {
  return parseOrThrow(serverEnvSchema, source);
}
