// Where the running test stack lives; `npm test` sets these for every layer.
export const BASE_URL = process.env.PUBLIC_BASE_URL ?? 'http://127.0.0.1:3100';
export const MAIL_SINK_URL = process.env.MAIL_SINK_URL ?? 'http://127.0.0.1:8035';
export const DEMO_PASSWORD = 'ringdown-demo';
