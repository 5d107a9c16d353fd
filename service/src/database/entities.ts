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
import { DataLogger } from '../modules/runs/logger.entity.js';

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
  DataLogger,
];
