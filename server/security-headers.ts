import helmet from 'helmet';

/**
 * The browser may reach only this origin: fonts, icons and scripts ship with
 * the app. Inline styles stay allowed because Angular Material injects
 * component styles at run time; inline scripts do not.
 */
export const securityHeaders = (behindTls: boolean) => helmet({
  // HSTS only means something when the app is served over TLS.
  strictTransportSecurity: behindTls ? { maxAge: 31_536_000, includeSubDomains: true } : false,
  contentSecurityPolicy: {
    useDefaults: false,
    directives: {
      defaultSrc: ["'self'"],
      scriptSrc: ["'self'"],
      styleSrc: ["'self'", "'unsafe-inline'"],
      imgSrc: ["'self'", 'data:', 'blob:'],
      fontSrc: ["'self'"],
      connectSrc: ["'self'"],
      workerSrc: ["'self'", 'blob:'],
      objectSrc: ["'none'"],
      baseUri: ["'self'"],
      formAction: ["'self'"],
      frameAncestors: ["'none'"],
    },
  },
  crossOriginEmbedderPolicy: false,
});
