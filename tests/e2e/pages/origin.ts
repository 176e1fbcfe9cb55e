/** Where the Playwright run serves the web app (playwright.config.ts starts it there). */
export const WEB_PORT = Number(process.env.E2E_WEB_PORT ?? 3100);
export const APP_ORIGIN = `http://127.0.0.1:${WEB_PORT}`;

/**
 * Headers of an API call made the way the app's own pages make it: browsers send Origin with every
 * POST, and the app refuses state-changing requests without the app's own (tests/e2e/headers.spec.ts).
 */
export const SAME_ORIGIN = { origin: APP_ORIGIN } as const;
