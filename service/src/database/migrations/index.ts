import type { MigrationInterface } from 'typeorm';
import { Foundation1796162547067 } from './1796162547067-Foundation.js';
import { RunLog1796163443370 } from './1796163443370-RunLog.js';
import { Mill1796164211009 } from './1796164211009-Mill.js';
import { ChecklistsQualifications1796164498769 } from './1796164498769-ChecklistsQualifications.js';
import { IndicatorCards1796164976631 } from './1796164976631-IndicatorCards.js';
import { Maintenance1796166275712 } from './1796166275712-Maintenance.js';
import { CardSetBarometer1796414559444 } from './1796414559444-CardSetBarometer.js';
import { ReadingsPointRunIndex1796169344642 } from './1796169344642-ReadingsPointRunIndex.js';
import { AlarmSuppression1796170500000 } from './1796170500000-AlarmSuppression.js';
import { SiteSettings1796413937879 } from './1796413937879-SiteSettings.js';
import { UserSessionVersion1796414632333 } from './1796414632333-UserSessionVersion.js';
import { Payments1796422787315 } from './1796422787315-Payments.js';
import { LotWords1796424481387 } from './1796424481387-LotWords.js';

/** Every migration in order. Add new ones at the end; never edit one that has been committed. */
export const MIGRATIONS: (new () => MigrationInterface)[] = [
  Foundation1796162547067,
  RunLog1796163443370,
  Mill1796164211009,
  ChecklistsQualifications1796164498769,
  IndicatorCards1796164976631,
  Maintenance1796166275712,
  ReadingsPointRunIndex1796169344642,
  AlarmSuppression1796170500000,
  SiteSettings1796413937879,
  CardSetBarometer1796414559444,
  UserSessionVersion1796414632333,
  Payments1796422787315,
  LotWords1796424481387,
];
