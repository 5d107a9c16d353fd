import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ClusterModule } from '../cluster/cluster.module.js';
import { UsersModule } from '../users/users.module.js';
import { Engine } from './engine.entity.js';
import { Cylinder } from './cylinder.entity.js';
import { Bearing } from './bearing.entity.js';
import { LubricationPoint } from './lubrication-point.entity.js';
import { MeasurementPoint } from './measurement-point.entity.js';
import { LimitChange } from './limit-change.entity.js';
import { EnginesService } from './engines.service.js';
import { EnginesController } from './engines.controller.js';
import { UnitsController } from './units.controller.js';

@Module({
  imports: [
    TypeOrmModule.forFeature([Engine, Cylinder, Bearing, LubricationPoint, MeasurementPoint, LimitChange]),
    UsersModule,
    ClusterModule,
  ],
  providers: [EnginesService],
  controllers: [EnginesController, UnitsController],
  exports: [EnginesService],
})
export class EnginesModule {}
