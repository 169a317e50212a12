import compression from 'compression';
import cookieParser from 'cookie-parser';
import express, { type Express } from 'express';
import helmet from 'helmet';
import { resolve } from 'node:path';
import { config } from './config';
import { errorMiddleware, notFoundHandler } from './core/error-middleware';
import { requestLogging } from './core/request-logging';
import { paymentWebhookRouter } from './modules/billing/webhook.router';
import { apiRoutes } from './modules/routes';
import { openApiRouter } from './openapi/router';
import { servePortals } from './serve-portals';

/** Builds the Express app (what supertest imports); `main.ts` listens. */
export function createApp(): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.set('query parser', 'simple');

  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          defaultSrc: ["'self'"],
          scriptSrc: ["'self'"],
          // Angular and Material add component styles at run time.
          styleSrc: ["'self'", "'unsafe-inline'"],
          fontSrc: ["'self'"],
          imgSrc: ["'self'", 'data:', 'blob:'],
          connectSrc: ["'self'"],
          objectSrc: ["'none'"],
          frameAncestors: ["'none'"],
          baseUri: ["'self'"],
          formAction: ["'self'"],
          ...(config.production ? { upgradeInsecureRequests: [] } : {}),
        },
      },
      strictTransportSecurity: config.production,
    }),
  );
  app.use(requestLogging);
  // gzip runs in libuv's thread pool, not on the request thread; PDFs and images are already compressed.
  app.use(compression());

  const api = express.Router();
  api.use(paymentWebhookRouter()); // raw body: before the JSON parser
  api.use(express.json({ limit: config.bodyLimit }));
  api.use(cookieParser());
  api.use(openApiRouter());
  api.use(apiRoutes());
  api.use(notFoundHandler);
  app.use('/api', api);

  servePortals(app, resolve(config.portalsDir));
  app.use(errorMiddleware);
  return app;
}
