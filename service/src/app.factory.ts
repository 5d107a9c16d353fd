import 'reflect-metadata';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { SwaggerModule } from '@nestjs/swagger';
import helmet from 'helmet';
import { pinoHttp } from 'pino-http';
import express from 'express';
import { AppModule } from './app.module.js';
import { AppConfig } from './config/app-config.service.js';
import { buildApiDocument } from './common/openapi/openapi-document.js';

/** Builds the application with every global piece; used by main.ts and the end-to-end tests. */
export async function createApp(opts: { logger?: boolean } = {}): Promise<NestExpressApplication> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, {
    logger: opts.logger === false ? ['error'] : ['error', 'warn', 'log'],
    bodyParser: false,
  });
  const config = app.get(AppConfig);
  app.set('trust proxy', 'loopback');
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: {
          'default-src': ["'self'"],
          'img-src': ["'self'", 'data:', 'blob:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'font-src': ["'self'", 'data:'],
          'connect-src': ["'self'", 'ws:', 'wss:'],
          'script-src': ["'self'"],
          'upgrade-insecure-requests': null,
        },
      },
      crossOriginEmbedderPolicy: false,
      strictTransportSecurity: false,
    }),
  );
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
  // The payment service signs the exact bytes it sends: its webhook keeps the raw body for the SDK to verify.
  app.use('/api/payments/webhook', express.raw({ type: () => true, limit: '1mb' }));
  app.use('/api', express.json({ limit: '5mb' }));
  app.setGlobalPrefix('api');
  app.enableShutdownHooks();

  const doc = buildApiDocument(app);
  SwaggerModule.setup('api/docs', app, doc, { jsonDocumentUrl: 'api/docs-json' });

  const uiDist = config.get('UI_DIST') ?? join(process.cwd(), '..', 'ui', 'dist');
  if (existsSync(join(uiDist, 'index.html'))) {
    app.useStaticAssets(uiDist, {
      index: false,
      maxAge: '1h',
      setHeaders: (res, path) => {
        if (path.includes('/assets/')) res.setHeader('Cache-Control', 'public, max-age=31536000, immutable');
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
