import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { RunsModule } from '../runs/runs.module.js';
import { UsersModule } from '../users/users.module.js';
import { EnginesModule } from '../engines/engines.module.js';
import { StorageModule } from '../storage/storage.module.js';
import { LiveModule } from '../live/live.module.js';
import { CardSet } from './card-set.entity.js';
import { IndicatorCard } from './indicator-card.entity.js';
import { CardImage } from './card-image.entity.js';
import { BrakeFigure } from './brake-figure.entity.js';
import { CardRecordAmendment } from './card-record-amendment.entity.js';
import { CardSetsService } from './card-sets.service.js';
import { CardSetMapper } from './card-set-mapper.js';
import { CardImagesService } from './card-images.service.js';
import { BrakeFiguresService } from './brake-figures.service.js';
import { CardSetsController } from './card-sets.controller.js';
import { IndicatorCalculationsController } from './indicator-calculations.controller.js';

/** Indicator cards and indicated power: card sets of a run, traced images, brake figures, the calculator route. */
@Module({
  imports: [
    TypeOrmModule.forFeature([CardSet, IndicatorCard, CardImage, BrakeFigure, CardRecordAmendment]),
    RunsModule,
    EnginesModule,
    StorageModule,
    LiveModule,
    UsersModule,
  ],
  providers: [CardSetsService, CardSetMapper, CardImagesService, BrakeFiguresService],
  controllers: [CardSetsController, IndicatorCalculationsController],
  exports: [CardSetsService, CardImagesService],
})
export class IndicatorCardsModule {}
