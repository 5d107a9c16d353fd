import { User } from '../modules/users/user.entity.js';
import { Invitation } from '../modules/users/invitation.entity.js';
import { RefreshToken } from '../modules/auth/refresh-token.entity.js';

import { Engine } from '../modules/engines/engine.entity.js';
import { Cylinder } from '../modules/engines/cylinder.entity.js';
import { Bearing } from '../modules/engines/bearing.entity.js';
import { LubricationPoint } from '../modules/engines/lubrication-point.entity.js';
import { MeasurementPoint } from '../modules/engines/measurement-point.entity.js';
import { LimitChange } from '../modules/engines/limit-change.entity.js';
import { Alarm } from '../modules/alarms/alarm.entity.js';
import { AlarmEvent } from '../modules/alarms/alarm-event.entity.js';
import { Run } from '../modules/runs/run.entity.js';
import { RunStateChange } from '../modules/runs/run-state-change.entity.js';
import { Reading } from '../modules/runs/reading.entity.js';
import { ReadingAmendment } from '../modules/runs/reading-amendment.entity.js';
import { RunPointFigure } from '../modules/runs/run-point-figure.entity.js';
import { DataLogger } from '../modules/runs/logger.entity.js';
import { Mill } from '../modules/mill/mill.entity.js';
import { MillStand } from '../modules/mill/mill-stand.entity.js';
import { PassSchedule } from '../modules/mill/pass-schedule.entity.js';
import { SchedulePass } from '../modules/mill/schedule-pass.entity.js';
import { MillBar } from '../modules/mill/mill-bar.entity.js';
import { MillPass } from '../modules/mill/mill-pass.entity.js';
import { CustomerLot } from '../modules/mill/customer-lot.entity.js';
import { LotStatusChange } from '../modules/mill/lot-status-change.entity.js';
import { LotRun } from '../modules/mill/lot-run.entity.js';
import { LotQuote } from '../modules/mill/lot-quote.entity.js';
import { Qualification } from '../modules/qualifications/qualification.entity.js';
import { ChecklistTemplate, ChecklistTemplateVersion } from '../modules/checklists/checklist-template.entity.js';
import { Checklist, ChecklistEntry, ChecklistAmendment } from '../modules/checklists/checklist.entity.js';
import { CardSet } from '../modules/indicator-cards/card-set.entity.js';
import { IndicatorCard } from '../modules/indicator-cards/indicator-card.entity.js';
import { CardImage } from '../modules/indicator-cards/card-image.entity.js';
import { BrakeFigure } from '../modules/indicator-cards/brake-figure.entity.js';
import { CardRecordAmendment } from '../modules/indicator-cards/card-record-amendment.entity.js';

import { InspectionPlan } from '../modules/maintenance/inspection-plan.entity.js';
import { Inspection, InspectionMeasurement, InspectionAttachment } from '../modules/maintenance/inspection.entity.js';
import { WorkRecord } from '../modules/maintenance/work-record.entity.js';
import { RunPointStat } from '../modules/maintenance/run-point-stat.entity.js';
import { Oil, LubricationPointOil } from '../modules/lubrication/oil.entity.js';
import { OilConsumptionEntry } from '../modules/lubrication/oil-consumption.entity.js';
import { SiteSettings } from '../modules/site/site-settings.entity.js';
import { VisitorBoard } from '../modules/visit/visitor-board.entity.js';
import { Payment, PaymentEvent, PaymentRefund } from '../modules/payments/payment.entity.js';
/** Every entity, in one list for the application and the migration CLI. Add new ones here. */
export const ENTITIES = [
  User,
  Invitation,
  RefreshToken,
  Engine,
  Cylinder,
  Bearing,
  LubricationPoint,
  MeasurementPoint,
  LimitChange,
  Alarm,
  AlarmEvent,
  Run,
  RunStateChange,
  Reading,
  ReadingAmendment,
  RunPointFigure,
  DataLogger,
  Mill,
  MillStand,
  PassSchedule,
  SchedulePass,
  MillBar,
  MillPass,
  CustomerLot,
  LotStatusChange,
  LotRun,
  LotQuote,
  Qualification,
  ChecklistTemplate,
  ChecklistTemplateVersion,
  Checklist,
  ChecklistEntry,
  ChecklistAmendment,
  CardSet,
  IndicatorCard,
  CardImage,
  BrakeFigure,
  CardRecordAmendment,
  InspectionPlan,
  Inspection,
  InspectionMeasurement,
  InspectionAttachment,
  WorkRecord,
  RunPointStat,
  Oil,
  LubricationPointOil,
  OilConsumptionEntry,
  SiteSettings,
  VisitorBoard,
  Payment,
  PaymentRefund,
  PaymentEvent,
];
