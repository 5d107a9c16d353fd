import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, Repository } from 'typeorm';
import type { CardDto, CardSetDto } from '@crankjournal/shared-types';
import { UsersService } from '../users/users.service.js';
import { amendmentsBySubject } from './card-set-amendments.js';
import { CardRecordAmendment } from './card-record-amendment.entity.js';
import type { CardSet } from './card-set.entity.js';
import { IndicatorCard } from './indicator-card.entity.js';

/** Card sets as the API answers them: their cards in cylinder and end order, names of who did what, amendments. */
@Injectable()
export class CardSetMapper {
  constructor(
    @InjectRepository(IndicatorCard) private readonly cards: Repository<IndicatorCard>,
    @InjectRepository(CardRecordAmendment) private readonly amendments: Repository<CardRecordAmendment>,
    private readonly users: UsersService,
  ) {}

  async toDtos(sets: CardSet[]): Promise<CardSetDto[]> {
    if (!sets.length) return [];
    const cards = await this.cards.find({ where: { cardSetId: In(sets.map((s) => s.id)) }, order: { createdAt: 'ASC' } });
    const amendments = await this.amendments.find({
      where: [
        { subjectType: 'card_set', subjectId: In(sets.map((s) => s.id)) },
        ...(cards.length ? [{ subjectType: 'card' as const, subjectId: In(cards.map((c) => c.id)) }] : []),
      ],
      order: { at: 'ASC' },
    });
    const userIds = [...new Set([...sets.map((s) => s.createdBy), ...cards.map((c) => c.createdBy), ...amendments.map((a) => a.byUser)])];
    const name = await this.users.displayNames(userIds);
    const bySubject = amendmentsBySubject(amendments, name);
    const endOrder = { head: 0, crank: 1 } as const;
    return sets.map((s) => {
      const position = new Map(s.cylinders.map((c, i) => [c.label, i]));
      const mine: CardDto[] = cards
        .filter((c) => c.cardSetId === s.id)
        .sort((a, b) => (position.get(a.cylinderLabel) ?? 99) - (position.get(b.cylinderLabel) ?? 99) || endOrder[a.end] - endOrder[b.end])
        .map((c) => ({
          id: c.id,
          cardSetId: c.cardSetId,
          cylinderId: c.cylinderId,
          cylinderLabel: c.cylinderLabel,
          end: c.end,
          method: c.method,
          springPsiPerIn: c.springPsiPerIn,
          lengthIn: c.lengthIn,
          areaSqIn: c.areaSqIn,
          ordinatesIn: c.ordinatesIn,
          givenMeanEffectivePressurePsi: c.givenMeanEffectivePressurePsi,
          imageId: c.imageId,
          trace: c.trace,
          traceOrigin: c.traceOrigin,
          cutOffPercent: c.cutOffPercent,
          compressionPercent: c.compressionPercent,
          admissionPressurePsig: c.admissionPressurePsig,
          note: c.note,
          meanHeightIn: c.meanHeightIn,
          meanEffectivePressurePsi: c.meanEffectivePressurePsi,
          tracedAreaSqIn: c.tracedAreaSqIn,
          outline: c.outline,
          createdBy: c.createdBy,
          createdByName: name.get(c.createdBy) ?? 'unknown',
          createdAt: c.createdAt.toISOString(),
          amendments: bySubject.get(c.id) ?? [],
        }));
      return {
        id: s.id,
        runId: s.runId,
        engineId: s.engineId,
        takenAt: s.takenAt.toISOString(),
        speedRpm: s.speedRpm,
        speedSource: s.speedSource,
        speedReadingAt: s.speedReadingAt?.toISOString() ?? null,
        cutOffPercent: s.cutOffPercent,
        throttlePressurePsig: s.throttlePressurePsig,
        throttleSource: s.throttleSource,
        receiverPressurePsig: s.receiverPressurePsig,
        receiverSource: s.receiverSource,
        vacuumInHg: s.vacuumInHg,
        vacuumSource: s.vacuumSource,
        barometerInHg: s.barometerInHg,
        barometerSource: s.barometerSource,
        notes: s.notes,
        cylinders: s.cylinders,
        cards: mine,
        results: s.results,
        createdBy: s.createdBy,
        createdByName: name.get(s.createdBy) ?? 'unknown',
        createdAt: s.createdAt.toISOString(),
        amendments: bySubject.get(s.id) ?? [],
      };
    });
  }
}
