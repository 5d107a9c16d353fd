import 'reflect-metadata';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { JwtService } from '@nestjs/jwt';
import { SwaggerModule } from '@nestjs/swagger';
import compression from 'compression';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import express from 'express';
import { AppModule } from './app.module.js';
import { AppConfig } from './config/app-config.service.js';
import { buildApiDocument } from './common/openapi/openapi-document.js';
import { PostgresIoAdapter } from './common/ws/postgres-io.adapter.js';
import { uiAssets } from './common/util/ui-assets.js';

/** Builds the application with every global piece; used by main.ts and the end-to-end tests. */
export async function createApp(opts: { logger?: boolean } = {}): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    logger: opts.logger === false ? ['error'] : ['error', 'warn', 'log'],
    bodyParser: false,
  });
  const config = app.get(AppConfig);
  app.set('trust proxy', config.get('TRUST_PROXY'));
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          // The own origin only (its ws:/wss: included): the UI talks to nothing else.
          'connect-src': ["'self'"],
          'script-src': ["'self'"],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginEmbedderPolicy: false,
      strictTransportSecurity: false,
    }),
  );
  const uiDist = config.get('UI_DIST') ?? join(process.cwd(), '..', 'ui', 'dist');
  const servesUi = existsSync(join(uiDist, 'index.html'));
  // The UI's hashed files from memory, compressed once (ahead of the per-answer compression below).
  if (servesUi) app.use(uiAssets(uiDist));
  // Answers compressed when the client accepts it (the UI's scripts and the JSON of the pages: a tablet on poor
  // Wi-Fi gets a fraction of the bytes). The socket.io channel and uploads are not touched; small answers go plain.
  app.use(compression({ threshold: 1024 }));
  // HSTS only on answers to HTTPS requests: served over plain HTTP (the local default) it would mean nothing.
  const hsts = config.get('HSTS_MAX_AGE_SECONDS');
  if (hsts > 0)
    app.use((req: express.Request, res: express.Response, next: express.NextFunction) => {
      if (req.secure) res.setHeader('Strict-Transport-Security', `max-age=${hsts}; includeSubDomains`);
      next();
    });
  if (config.get('LOG_LEVEL') !== 'silent' && opts.logger !== false) {
    app.use(
      pinoHttp({
        level: config.get('LOG_LEVEL'),
        autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
        redact: ['req.headers.authorization', 'req.headers.cookie'],
        serializers: { req: (r) => ({ method: r.method, url: r.url }), res: (r) => ({ statusCode: r.statusCode }) },
      }),
    );
  }
  app.useWebSocketAdapter(new PostgresIoAdapter(app, config.get('DATABASE_URL')));
  // The payment service signs the exact bytes it sends: its webhook keeps the raw body for the SDK to verify.
  app.use('/api/payments/webhook', express.raw({ type: () => true, limit: '1mb' }));
  app.use('/api', express.json({ limit: '5mb' }));
  app.setGlobalPrefix('api');
  app.enableShutdownHooks();

  const docs = config.get('API_DOCS');
  if (docs === 'signed-in') {
    // Only with a valid access token (the page embeds the description, so it is held back too).
    const jwt = app.get(JwtService);
    app.use(['/api/docs', '/api/docs-json'], (req: express.Request, res: express.Response, next: express.NextFunction) => {
      const token = /^Bearer (.+)$/.exec(req.headers.authorization ?? '')?.[1];
      jwt.verifyAsync(token ?? '').then(
        () => next(),
        () =>
          res
            .status(401)
            .json({ statusCode: 401, error: 'Unauthorized', message: 'Sign in to read the API description (send your access token).' }),
      );
    });
  }
  if (docs !== 'off') SwaggerModule.setup('api/docs', app, buildApiDocument(app), { jsonDocumentUrl: 'api/docs-json' });

  if (servesUi) {
    app.useStaticAssets(uiDist, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, path) => {
        if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
        // The installable app's service worker and manifest: a tablet checks them for a new version at each visit.
        else if (/(^|[\\/])(sw\.js|sw-outbox\.js|manifest\.webmanifest)$/.test(path)) res.setHeader('Cache-Control', 'no-cache');
      },
    });
    app.use((req: express.Request, res: express.Response, next: express.NextFunction) => {
      if (req.method !== 'GET' || req.path.startsWith('/api') || req.path.startsWith('/socket.io')) return next();
      res.setHeader('Cache-Control', 'no-cache');
      res.sendFile(join(uiDist, 'index.html'));
    });
  }
  return app;
}
