/**
 * Security headers (helmet), OWASP Secure Headers Project and ASVS 14.4:
 * - a content security policy the built client satisfies: everything from our own origin (scripts,
 *   the bundled Lato fonts, the Tailwind stylesheet, fetches to /api); no inline scripts or style
 *   elements (React sets styles through the DOM, which CSP allows); images also as data: URLs (SVG
 *   icons that Vite inlines); no plugins, no <base>, forms only to us, and no framing at all
 *   (frame-ancestors 'none', plus X-Frame-Options for older browsers);
 * - Referrer-Policy: no-referrer, because reset and invitation tokens sit in URLs;
 * - X-Content-Type-Options: nosniff;
 * - HSTS (and upgrade-insecure-requests) only when the public URL is https: on plain http a
 *   browser ignores HSTS, and on localhost it would pin https for every other local project.
 */
import type { RequestHandler } from 'express';
import helmet from 'helmet';
import type { Config } from '../config';

export function securityHeaders(config: Config): RequestHandler {
  const https = config.publicUrl.startsWith('https:');
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        styleSrc: ["'self'"],
        // Vite inlines the smallest Lato subsets as data: URLs in the stylesheet.
        fontSrc: ["'self'", 'data:'],
        imgSrc: ["'self'", 'data:'],
        connectSrc: ["'self'"],
        objectSrc: ["'none'"],
        baseUri: ["'none'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
        ...(https ? { upgradeInsecureRequests: [] } : {}),
      },
    },
    referrerPolicy: { policy: 'no-referrer' },
    xFrameOptions: { action: 'deny' },
    strictTransportSecurity: https ? { maxAge: 365 * 24 * 3600, includeSubDomains: true } : false,
  });
}
