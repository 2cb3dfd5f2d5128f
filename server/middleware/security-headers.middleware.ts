import type { RequestHandler } from 'express';
import helmet from 'helmet';

/**
 * Security headers for every answer. The policy allows exactly what the app uses: its own scripts
 * (no inline ones), WebAssembly compiled from its own /wasm files, the pose worker, blob: media and
 * images (stills, uploads being checked) and data: fonts and images from the bundle. No page may frame
 * the app. HSTS only when the app is served over https (set by PUBLIC_URL).
 */
export function securityHeaders(options: { https: boolean }): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'", "'wasm-unsafe-eval'"],
        workerSrc: ["'self'", 'blob:'],
        connectSrc: ["'self'", 'blob:', 'data:'],
        imgSrc: ["'self'", 'data:', 'blob:'],
        mediaSrc: ["'self'", 'blob:'],
        fontSrc: ["'self'", 'data:'],
        // Styles: the bundled sheet, plus style attributes that the chart library writes into its SVG.
        styleSrc: ["'self'", "'unsafe-inline'"],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
      },
    },
    strictTransportSecurity: options.https ? { maxAge: 180 * 24 * 3600, includeSubDomains: true } : false,
    referrerPolicy: { policy: 'no-referrer' },
    xContentTypeOptions: true,
    xFrameOptions: { action: 'deny' },
    crossOriginEmbedderPolicy: false,
  });
}
