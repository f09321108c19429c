/** Addresses of the test stack (make test exports them; these defaults match scripts/stack.sh's test profile). */
export const TEST_PG_PORT = Number(process.env.PGPORT ?? 55433);
export const ADMIN_URL = `postgres://postgres@127.0.0.1:${TEST_PG_PORT}/postgres`;
export const TEMPLATE_DB = 'yokeline_template';
export const dbUrl = (name: string) => `postgres://postgres@127.0.0.1:${TEST_PG_PORT}/${name}`;
export const MAIL_CAPTURE_URL = process.env.MAIL_CAPTURE_URL ?? 'http://127.0.0.1:2626';
export const SMTP_PORT = Number(process.env.SMTP_PORT ?? 2625);
export const S3_ENDPOINT = process.env.S3_ENDPOINT ?? 'http://127.0.0.1:4669';
/** The API + built web served by make test for browser tests. */
export const E2E_BASE_URL = process.env.E2E_BASE_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3100}`;
