import type { RequestHandler } from 'express';
import helmet from 'helmet';

/**
 * Security headers through helmet (docs/security.md). The Content-Security-Policy fits the built
 * app: scripts, fonts (self-hosted Roboto), images and API calls from the app's own origin only;
 * styles from the origin plus inline, because MUI's emotion writes <style> elements at run time;
 * no frames of or by others (`frame-ancestors 'none'`), no plugins, forms post only to us. The
 * payment service's origins (its browser script, its API, its authentication frame) are the one
 * exception, for scripts, connections and frames: see `paymentOrigins`.
 * `upgrade-insecure-requests` and HSTS only when the app is served over https.
 */
export function securityHeaders(opts: { https: boolean; paymentOrigins?: string[] }): RequestHandler {
  const pay = opts.paymentOrigins ?? [];
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", ...pay],
        styleSrc: ["'self'", "'unsafe-inline'"],
        fontSrc: ["'self'", 'data:'],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'", ...pay],
        frameSrc: pay.length ? pay : ["'none'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(opts.https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    referrerPolicy: { policy: 'no-referrer' },
    strictTransportSecurity: opts.https ? { maxAge: 15_552_000, includeSubDomains: true } : false,
    xFrameOptions: { action: 'deny' },
  });
}

/** The CSP of the OpenAPI page (Swagger UI), which needs inline scripts and styles of its own. */
export function apiDocsHeaders(): RequestHandler {
  return helmet.contentSecurityPolicy({
    useDefaults: false,
    directives: {
      defaultSrc: ["'self'"],
      scriptSrc: ["'self'", "'unsafe-inline'"],
      styleSrc: ["'self'", "'unsafe-inline'"],
      imgSrc: ["'self'", 'data:'],
      frameAncestors: ["'none'"],
      objectSrc: ["'none'"],
    },
  });
}

/**
 * `Cache-Control: no-store` on every API answer: they are personal (the signed-in user's bikes,
 * sheets, team) or cheap, and must not be kept by the browser or a shared cache.
 */
export const noStore: RequestHandler = (_req, res, next) => {
  res.setHeader('Cache-Control', 'no-store');
  next();
};

/**
 * The origins the payment step needs in the browser: the configured script's origin (the local
 * payment fake serves script, API and authentication page from one origin), or, when the library
 * loads the hosted service's own script, the origins that service documents for its script, API
 * and authentication frames.
 */
export function paymentOrigins(scriptUrl: string | null): string[] {
  if (scriptUrl) return [new URL(scriptUrl).origin];
  return ['https://js.stripe.com', 'https://api.stripe.com', 'https://hooks.stripe.com'];
}
