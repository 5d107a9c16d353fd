import { Injectable, NotFoundException, UnauthorizedException } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { Repository } from 'typeorm';
import type { IssuedLoggerKey, LoggerDto } from '@crankjournal/shared-types';
import { ClusterService } from '../cluster/cluster.service.js';
import { EnginesService } from '../engines/engines.service.js';
import { newSecret, sha256 } from '../../common/util/password.util.js';
import { DataLogger } from './logger.entity.js';

const KEY_CACHE_MS = 5_000;

/** Data loggers and their keys. A key is shown once at issue; only its hash is kept. */
@Injectable()
export class LoggersService {
  private readonly cache = new Map<string, { logger: DataLogger | null; at: number }>();

  constructor(
    @InjectRepository(DataLogger) private readonly loggers: Repository<DataLogger>,
    private readonly engines: EnginesService,
    private readonly cluster: ClusterService,
  ) {
    // A key revoked through another instance stops working here at once, not after KEY_CACHE_MS.
    cluster.on('logger', () => this.cache.clear());
  }

  toDto(l: DataLogger): LoggerDto {
    return {
      id: l.id,
      engineId: l.engineId,
      name: l.name,
      keyPrefix: l.keyPrefix,
      createdAt: l.createdAt.toISOString(),
      revokedAt: l.revokedAt?.toISOString() ?? null,
      lastSeenAt: l.lastSeenAt?.toISOString() ?? null,
    };
  }

  async list(): Promise<LoggerDto[]> {
    return (await this.loggers.find({ order: { createdAt: 'DESC' } })).map((l) => this.toDto(l));
  }

  async issue(engineId: string, name: string, by: string): Promise<IssuedLoggerKey> {
    await this.engines.get(engineId);
    const { secret } = newSecret(24);
    const key = `cjl_${secret}`;
    const l = await this.loggers.save(
      this.loggers.create({
        engineId,
        name: name.trim(),
        keyPrefix: key.slice(0, 10),
        keyHash: sha256(key),
        createdBy: by,
        revokedAt: null,
        lastSeenAt: null,
      }),
    );
    return { ...this.toDto(l), key };
  }

  async revoke(id: string): Promise<LoggerDto> {
    const l = await this.loggers.findOne({ where: { id } });
    if (!l) throw new NotFoundException('No such logger.');
    if (!l.revokedAt) {
      l.revokedAt = new Date();
      await this.loggers.save(l);
    }
    this.cache.clear();
    await this.cluster.announce('logger', l.id);
    return this.toDto(l);
  }

  /** The logger a key belongs to, if the key is valid and not revoked. */
  async authenticate(key: unknown): Promise<DataLogger> {
    if (typeof key !== 'string' || !key.startsWith('cjl_') || key.length > 200)
      throw new UnauthorizedException('A data logger must send its key in the x-logger-key header.');
    const hash = sha256(key);
    const hit = this.cache.get(hash);
    let logger = hit && Date.now() - hit.at < KEY_CACHE_MS ? hit.logger : undefined;
    if (logger === undefined) {
      logger = await this.loggers.findOne({ where: { keyHash: hash } });
      this.cache.set(hash, { logger, at: Date.now() });
      if (logger) void this.loggers.update({ id: logger.id }, { lastSeenAt: new Date() });
    }
    if (!logger || logger.revokedAt) throw new UnauthorizedException('This logger key is not valid or has been revoked.');
    return logger;
  }
}
