import { Logger, type INestApplicationContext } from '@nestjs/common';
import { IoAdapter } from '@nestjs/platform-socket.io';
import { createAdapter } from '@socket.io/postgres-adapter';
import pg from 'pg';

type NestIoOptions = Parameters<IoAdapter['createIOServer']>[1];
type NestIoServer = ReturnType<IoAdapter['createIOServer']>;
type NestAdapter = Parameters<NestIoServer['adapter']>[0];

/**
 * socket.io across service instances: every room event (readings, alarms, disconnecting a person) goes to the
 * sockets of every instance on the same PostgreSQL, through NOTIFY (large payloads through socket_io_attachments).
 */
export class PostgresIoAdapter extends IoAdapter {
  private readonly pool: pg.Pool;

  constructor(app: INestApplicationContext, databaseUrl: string) {
    super(app);
    this.pool = new pg.Pool({ connectionString: databaseUrl, max: 4, application_name: 'crankjournal-live' });
    this.pool.on('error', () => undefined);
  }

  override createIOServer(port: number, options?: NestIoOptions): NestIoServer {
    const server = super.createIOServer(port, options);
    // @nestjs/platform-socket.io brings its own copy of socket.io (same major): its types differ only by path.
    const logger = new Logger('Live');
    const errorHandler = (e: Error) => logger.warn(`live events across instances: ${e.message}`);
    server.adapter(createAdapter(this.pool, { errorHandler }) as unknown as NestAdapter);
    return server;
  }

  override async dispose(): Promise<void> {
    await super.dispose();
    await this.pool.end().catch(() => undefined);
  }
}
