/**
 * The Express application, built from a context and returned without listening
 * (tests drive it with supertest; server/main.ts listens).
 */
import express, { type Express } from 'express';
import helmet from 'helmet';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import type { AppContext } from './context';
import { errorMiddleware } from './http/error-middleware';
import { refuseUnstorableText } from './http/text-guard';
import { apiRouter } from './api-router';

export interface AppOptions {
  /** Folder of the built client (vite build → dist/client); served with an SPA fallback. */
  clientDir?: string;
  /** Extra middleware mounted before the SPA fallback (Vite's dev middleware in `npm run dev`). */
  clientMiddleware?: express.RequestHandler;
}

export function createApp(ctx: AppContext, opts: AppOptions = {}): Express {
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: false,
        directives: {
          'default-src': ["'self'"],
          'script-src': ["'self'", ...(opts.clientMiddleware ? ["'unsafe-inline'"] : [])],
          'style-src': ["'self'", "'unsafe-inline'"],
          'img-src': ["'self'", 'data:'],
          'font-src': ["'self'"],
          'connect-src': ["'self'", ...(opts.clientMiddleware ? ['ws:'] : [])],
          'object-src': ["'none'"],
          'frame-ancestors': ["'none'"],
          'base-uri': ["'self'"],
          'form-action': ["'self'"],
        },
      },
      crossOriginEmbedderPolicy: false,
      strictTransportSecurity: ctx.config.publicUrl.startsWith('https://'),
    }),
  );
  app.use(express.json({ limit: '5mb' }));
  app.use(refuseUnstorableText);

  app.use('/api', apiRouter(ctx));

  if (opts.clientMiddleware) app.use(opts.clientMiddleware);
  if (opts.clientDir && existsSync(join(opts.clientDir, 'index.html'))) {
    const dir = opts.clientDir;
    app.use(express.static(dir, { index: false, maxAge: '1h', setHeaders: (res, path) => {
      if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
    } }));
    // client-side routes: every other GET gets the app shell
    app.get(/^\/(?!api\/).*/, (_req, res) => {
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(join(dir, 'index.html'));
    });
  }
  app.use(errorMiddleware(ctx.logger));
  return app;
}
