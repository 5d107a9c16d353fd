import { Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import type { EntityManager } from 'typeorm';
import pg from 'pg';
import PgBoss from 'pg-boss';
import { AppConfig } from '../../config/app-config.service.js';

/** The schema the job queue keeps its tables in (created and migrated by the queue itself at start-up). */
export const JOBS_SCHEMA = 'pgboss';

/**
 * Setting up the queue (its schema at start, a queue's table when it is first made) takes locks on shared tables;
 * two instances starting at once against the same database could deadlock there. Every set-up step therefore
 * holds one cluster-wide advisory lock (any number), so instances set up one after another.
 */
const SETUP_LOCK_KEY = 'crankjournal:job-queue-setup';

/** Retry settings of a queue: tries after the first, seconds before the first retry, doubling (with jitter) or not. */
export interface RetryPolicy {
  retryLimit: number;
  retryDelay: number;
  retryBackoff: boolean;
}

/** One job as the administrator sees it. */
export interface JobRow {
  id: string;
  queue: string;
  state: string;
  retryCount: number;
  retryLimit: number;
  createdOn: Date;
  startAfter: Date;
  completedOn: Date | null;
  data: unknown;
  output: unknown;
}

/**
 * The durable job queue (pg-boss on the service's own PostgreSQL). A job may be written inside a TypeORM
 * transaction (`send(..., m)`), so it exists exactly when what it reports was committed. Workers run in every
 * instance; each job is fetched by one of them (SKIP LOCKED), retried with back-off when its handler throws.
 */
@Injectable()
export class JobsService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Jobs');
  private readonly boss: PgBoss;
  private started = false;

  constructor(private readonly config: AppConfig) {
    this.boss = new PgBoss({
      connectionString: config.get('DATABASE_URL'),
      schema: JOBS_SCHEMA,
      max: 4,
      application_name: 'crankjournal-jobs',
    });
    this.boss.on('error', (e: Error) => this.logger.warn(`job queue: ${e.message}`));
  }

  async onModuleInit() {
    await this.oneInstanceAtATime(() => this.boss.start());
    this.started = true;
  }

  /** Runs a set-up step under the cluster-wide set-up lock (see SETUP_LOCK_KEY), on a connection of its own. */
  private async oneInstanceAtATime<T>(step: () => Promise<T>): Promise<T> {
    const client = new pg.Client({ connectionString: this.config.get('DATABASE_URL'), application_name: 'crankjournal-jobs-setup' });
    await client.connect();
    try {
      await client.query('SELECT pg_advisory_lock(hashtext($1))', [SETUP_LOCK_KEY]);
      return await step();
    } finally {
      await client.end().catch(() => undefined);
    }
  }

  async onModuleDestroy() {
    if (!this.started) return;
    this.started = false;
    await this.boss.stop({ graceful: true, wait: true, timeout: 5_000 });
  }

  /** Creates the queue if it is not there, and sets its retry policy. */
  async queue(name: string, retry: RetryPolicy): Promise<void> {
    await this.oneInstanceAtATime(async () => {
      if (!(await this.boss.getQueue(name))) await this.boss.createQueue(name, { name, ...retry });
      else await this.boss.updateQueue(name, { name, ...retry });
    });
  }

  /**
   * Adds a job; with `m`, inside that transaction (the job is written, or not, with the rest of it).
   * `startAfter` delays it (a Date or seconds from now).
   */
  async send(name: string, data: object, opts: { startAfter?: Date | number; singletonKey?: string } = {}, m?: EntityManager) {
    const runner = m?.queryRunner;
    if (m && !runner) throw new Error('JobsService.send: the entity manager is not in a transaction');
    const db = runner
      ? { executeSql: async (text: string, values: unknown[]) => ({ rows: (await runner.query(text, values, true)).records }) }
      : undefined;
    return this.boss.send(name, data, { ...opts, ...(db ? { db } : {}) });
  }

  /** Runs `handler` for each job of the queue, one at a time per instance; a throw fails the try (retried by the policy). */
  async work<T extends object>(name: string, handler: (data: T, job: { id: string; retryCount: number }) => Promise<void>) {
    await this.boss.work<T>(
      name,
      { pollingIntervalSeconds: this.config.get('JOBS_POLL_SECONDS'), batchSize: 1, includeMetadata: true },
      async ([job]) => {
        await handler(job.data, { id: job.id, retryCount: job.retryCount });
      },
    );
  }

  /** Jobs of some queues, newest first (live and archived), for the administrator. */
  async list(queues: string[], limit = 100): Promise<JobRow[]> {
    const cols = `id, name AS queue, state, retry_count AS "retryCount", retry_limit AS "retryLimit", created_on AS "createdOn",
      start_after AS "startAfter", completed_on AS "completedOn", data, output`;
    const { rows } = await this.boss.getDb().executeSql(
      `SELECT * FROM (
         SELECT ${cols} FROM ${JOBS_SCHEMA}.job WHERE name = ANY($1)
         UNION ALL
         SELECT ${cols} FROM ${JOBS_SCHEMA}.archive WHERE name = ANY($1)
       ) j ORDER BY "createdOn" DESC LIMIT $2`,
      [queues, limit],
    );
    return rows as JobRow[];
  }
}
