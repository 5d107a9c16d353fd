import { NestFactory } from '@nestjs/core';
import type { INestApplicationContext } from '@nestjs/common';
import { AppModule } from '../../app.module.js';

/** The application's services without the HTTP server, so the seed uses the same rules as the API. */
export async function seedContext(): Promise<INestApplicationContext> {
  return NestFactory.createApplicationContext(AppModule, { logger: ['error', 'warn'] });
}
