import type { MigrationInterface } from 'typeorm';
import { Foundation1796162547067 } from './1796162547067-Foundation.js';
import { RunLog1796163443370 } from './1796163443370-RunLog.js';
import { Mill1796164211009 } from './1796164211009-Mill.js';
import { ChecklistsQualifications1796164498769 } from './1796164498769-ChecklistsQualifications.js';
import { IndicatorCards1796164976631 } from './1796164976631-IndicatorCards.js';
import { Maintenance1796166275712 } from './1796166275712-Maintenance.js';
import { ReadingsPointRunIndex1796169344642 } from './1796169344642-ReadingsPointRunIndex.js';
import { AlarmSuppression1796170500000 } from './1796170500000-AlarmSuppression.js';
import { SiteSettings1796413937879 } from './1796413937879-SiteSettings.js';
import { CardSetBarometer1796414559444 } from './1796414559444-CardSetBarometer.js';
import { UserSessionVersion1796414632333 } from './1796414632333-UserSessionVersion.js';
import { AlarmForecastRecord1796422336848 } from './1796422336848-AlarmForecastRecord.js';
import { EngineCallList1796422448681 } from './1796422448681-EngineCallList.js';
import { CardTraceOrigin1796422565325 } from './1796422565325-CardTraceOrigin.js';
import { RunPointFigures1796422580256 } from './1796422580256-RunPointFigures.js';
import { VisitorBoards1796422583042 } from './1796422583042-VisitorBoards.js';
import { Payments1796422787315 } from './1796422787315-Payments.js';
import { ReadingClientIdPerRun1796423309760 } from './1796423309760-ReadingClientIdPerRun.js';
import { SeveralInstances1796424019287 } from './1796424019287-SeveralInstances.js';
import { ChecklistSignedOnDevice1796424079811 } from './1796424079811-ChecklistSignedOnDevice.js';
import { NamesKeptAsSigned1796424216765 } from './1796424216765-NamesKeptAsSigned.js';
import { LotWords1796424481387 } from './1796424481387-LotWords.js';
import { EnginePartsRetired1796424633674 } from './1796424633674-EnginePartsRetired.js';
import { ReadingAmendmentClientId1796426692568 } from './1796426692568-ReadingAmendmentClientId.js';

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
  AlarmForecastRecord1796422336848,
  EngineCallList1796422448681,
  CardTraceOrigin1796422565325,
  RunPointFigures1796422580256,
  VisitorBoards1796422583042,
  Payments1796422787315,
  ReadingClientIdPerRun1796423309760,
  SeveralInstances1796424019287,
  ChecklistSignedOnDevice1796424079811,
  NamesKeptAsSigned1796424216765,
  LotWords1796424481387,
  EnginePartsRetired1796424633674,
  ReadingAmendmentClientId1796426692568,
];
