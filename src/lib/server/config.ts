import { z } from 'zod';

// Every setting comes from the environment with a working local default; `.env.example`
// documents each one. Production points the same code at real MariaDB, S3 and SMTP.
const configSchema = z.object({
	DB_HOST: z.string().default('127.0.0.1'),
	DB_PORT: z.coerce.number().int().positive().default(3307),
	DB_USER: z.string().default('ringdown'),
	DB_PASSWORD: z.string().default('ringdown'),
	DB_NAME: z.string().default('ringdown'),
	DB_POOL_MAX: z.coerce.number().int().positive().default(10),

	S3_ENDPOINT: z.string().default('http://127.0.0.1:4569'),
	S3_PUBLIC_ENDPOINT: z.string().optional(),
	S3_REGION: z.string().default('us-east-1'),
	S3_BUCKET: z.string().default('ringdown-demo'),
	S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
	S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
	S3_FORCE_PATH_STYLE: z
		.enum(['true', 'false'])
		.default('true')
		.transform((v) => v === 'true'),
	// A store that does not take the connection, or stops answering mid-request, counts as down
	// after these (each request is tried twice): the answer is a 503 instead of a hung request.
	S3_CONNECT_TIMEOUT_MS: z.coerce.number().int().positive().default(2_000),
	S3_IDLE_TIMEOUT_MS: z.coerce.number().int().positive().default(5_000),
	// The longest one request may take in all (a large scripted upload included).
	S3_REQUEST_TIMEOUT_MS: z.coerce.number().int().positive().default(300_000),

	SMTP_HOST: z.string().default('127.0.0.1'),
	SMTP_PORT: z.coerce.number().int().positive().default(2525),
	SMTP_SECURE: z
		.enum(['true', 'false'])
		.default('false')
		.transform((v) => v === 'true'),
	SMTP_USER: z.string().optional(),
	SMTP_PASSWORD: z.string().optional(),
	MAIL_FROM: z.string().default('Ringdown <no-reply@ringdown.test>'),

	PUBLIC_BASE_URL: z.string().default('http://127.0.0.1:3000'),
	UPLOAD_MAX_BYTES: z.coerce.number().int().positive().default(200 * 1024 * 1024),
	// Largest request body of every route but the scripted upload (browsers upload to storage).
	BODY_MAX_BYTES: z.coerce.number().int().positive().default(1024 * 1024),
	ANALYSIS_MAX_DURATION_S: z.coerce.number().positive().default(60),

	// Signs the session tokens; `npm start` generates one into .data/auth-secret.
	AUTH_SECRET: z.string().optional(),
	// Requests one personal API token may make per minute (then 429 for a minute, doubling).
	API_TOKEN_REQUESTS_PER_MINUTE: z.coerce.number().int().positive().default(600),
	// How often an idle worker looks for work, and how long a claimed job stays its own.
	WORKER_POLL_MS: z.coerce.number().int().positive().default(500),
	JOB_LEASE_MS: z.coerce.number().int().positive().default(60_000)
});

export type AppConfig = z.infer<typeof configSchema>;

export function loadConfig(env: Record<string, string | undefined> = process.env): AppConfig {
	const parsed = configSchema.safeParse(env);
	if (!parsed.success) {
		const problems = parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
		throw new Error(`Invalid configuration: ${problems}`);
	}
	return parsed.data;
}

let cached: AppConfig | undefined;

/** The process-wide configuration, read once. */
export function config(): AppConfig {
	cached ??= loadConfig();
	return cached;
}
