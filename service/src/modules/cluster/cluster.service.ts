import { Injectable, Logger, type OnModuleDestroy, type OnModuleInit } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import pg from 'pg';
import { DataSource, EntityManager } from 'typeorm';
import { AppConfig } from '../../config/app-config.service.js';

/** The PostgreSQL channel every instance listens on for cache invalidations. */
export const CACHE_CHANNEL = 'crankjournal_cache';

/** What a cache holds: engines (limits, points), people (role, session version, name), logger keys, runs taking readings. */
export type CacheTopic = 'engine' | 'user' | 'logger' | 'run';

type Listener = (key: string | null) => void;

/**
 * Keeps the in-memory caches of several service instances on one PostgreSQL true: a change announces
 * `topic:key` with NOTIFY, and every instance (this one too) drops that entry on the LISTEN side. When the listening
 * connection is lost, notifications may have been missed: on reconnecting each listener is called with key null
 * (drop everything of the topic).
 */
@Injectable()
export class ClusterService implements OnModuleInit, OnModuleDestroy {
  private readonly logger = new Logger('Cluster');
  private readonly listeners = new Map<CacheTopic, Listener[]>();
  private client: pg.Client | null = null;
  private closing = false;
  private retry: NodeJS.Timeout | null = null;

  constructor(
    @InjectDataSource() private readonly db: DataSource,
    private readonly config: AppConfig,
  ) {}

  async onModuleInit() {
    await this.listen(false);
  }

  async onModuleDestroy() {
    this.closing = true;
    if (this.retry) clearTimeout(this.retry);
    await this.client?.end().catch(() => undefined);
    this.client = null;
  }

  /** Calls `fn` with the key of each change of `topic` announced by any instance (null: drop everything). */
  on(topic: CacheTopic, fn: Listener) {
    this.listeners.set(topic, [...(this.listeners.get(topic) ?? []), fn]);
  }

  /**
   * Tells every instance (this one included) that `key` of `topic` changed: at once, or with `m` when its transaction
   * commits (PostgreSQL holds a NOTIFY of a transaction until then, and drops it on rollback).
   */
  async announce(topic: CacheTopic, key: string, m?: EntityManager): Promise<void> {
    await (m ?? this.db.manager).query(`SELECT pg_notify($1, $2)`, [CACHE_CHANNEL, `${topic}:${key}`]);
  }

  private dispatch(topic: CacheTopic, key: string | null) {
    for (const fn of this.listeners.get(topic) ?? []) fn(key);
  }

  private async listen(resync: boolean) {
    const client = new pg.Client({ connectionString: this.config.get('DATABASE_URL'), application_name: 'crankjournal-cache' });
    client.on('notification', (n) => {
      if (n.channel !== CACHE_CHANNEL || !n.payload) return;
      const at = n.payload.indexOf(':');
      this.dispatch(n.payload.slice(0, at) as CacheTopic, n.payload.slice(at + 1));
    });
    const lost = () => {
      if (this.closing || this.client !== client) return;
      this.client = null;
      this.logger.warn('cache notifications lost; listening again');
      this.retry = setTimeout(() => void this.listen(true).catch(() => lost()), 1_000);
      this.retry.unref();
    };
    client.on('error', lost);
    client.on('end', lost);
    this.client = client;
    await client.connect();
    await client.query(`LISTEN ${CACHE_CHANNEL}`);
    if (resync) for (const topic of this.listeners.keys()) this.dispatch(topic, null);
  }
}
