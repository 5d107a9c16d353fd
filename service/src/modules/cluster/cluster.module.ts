import { Module } from '@nestjs/common';
import { ClusterService } from './cluster.service.js';

/** What several service instances on one PostgreSQL share: cache invalidations (LISTEN/NOTIFY). */
@Module({ providers: [ClusterService], exports: [ClusterService] })
export class ClusterModule {}
