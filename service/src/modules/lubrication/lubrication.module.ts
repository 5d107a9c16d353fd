import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { EnginesModule } from '../engines/engines.module.js';
import { RunsModule } from '../runs/runs.module.js';
import { UsersModule } from '../users/users.module.js';
import { Oil, LubricationPointOil } from './oil.entity.js';
import { OilConsumptionEntry } from './oil-consumption.entity.js';
import { LubricationService } from './lubrication.service.js';
import { LubricationController } from './lubrication.controller.js';
import { LubricationCalculationsController } from './lubrication-calculations.controller.js';

/** The lubrication programme: oils, points and their oils, consumption and trends, bearing figures, calculators. */
@Module({
  imports: [TypeOrmModule.forFeature([Oil, LubricationPointOil, OilConsumptionEntry]), EnginesModule, RunsModule, UsersModule],
  providers: [LubricationService],
  controllers: [LubricationController, LubricationCalculationsController],
  exports: [LubricationService],
})
export class LubricationModule {}
