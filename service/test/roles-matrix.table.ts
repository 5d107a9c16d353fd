/**
 * WHO MAY CALL WHAT — the one table the roles matrix (test/reliability/roles-matrix.rel-spec.ts) checks
 * every route and socket event against, for every role, without a token and with an expired token.
 *
 * Adding a route? Add its row here: 'METHOD /api/path' exactly as the router has it (":id" params), with
 *   - the roles allowed (as its @Roles(...) says; ANY_ROLE for @AnyRole()),
 *   - 'public' for @Public() routes anyone may call without signing in,
 *   - 'logger-key' for @Public() routes guarded by a data logger's key (x-logger-key) instead of a user.
 * Allowed means the answer is not 401/403 (a 400/404/409 from the data is fine); denied means 403 for a
 * signed-in role and 401 without a token or with an expired one. A route the router serves that is missing
 * here fails the test, and so does a row whose route no longer exists.
 */
import { ROLES, type Role } from '@crankjournal/shared-types';

export type RouteAccess = readonly Role[] | 'public' | 'logger-key';

const ANY_ROLE: readonly Role[] = ROLES;
const CHIEF: readonly Role[] = ['chief_engineer'];
const ADMIN: readonly Role[] = ['administrator'];
const ADMIN_CHIEF: readonly Role[] = ['administrator', 'chief_engineer'];
const ENGINE_CREW: readonly Role[] = ['chief_engineer', 'operator'];
const MILL: readonly Role[] = ['mill_lead', 'chief_engineer'];
const MONEY_READERS: readonly Role[] = ['administrator', 'chief_engineer', 'mill_lead', 'observer'];

export const ROUTE_ACCESS: Record<string, RouteAccess> = {
  // API documentation (SwaggerModule in app.factory.ts)
  'GET /api/docs': 'public',
  'GET /api/docs/': 'public',
  'GET /api/docs/index.html': 'public',
  'GET /api/docs/LICENSE': 'public',
  'GET /api/docs/swagger-ui-init.js': 'public',
  'GET /api/docs/docs/swagger-ui-init.js': 'public',
  'GET /api/docs-json': 'public',
  'GET /api/docs-yaml': 'public',

  // health
  'GET /api/health': 'public',

  // auth
  'POST /api/auth/login': 'public',
  'POST /api/auth/refresh': 'public',
  'POST /api/auth/accept-invitation': 'public',
  'POST /api/auth/logout': ANY_ROLE,
  'POST /api/auth/logout-everywhere': ANY_ROLE,
  'GET /api/auth/me': ANY_ROLE,
  'PATCH /api/auth/me': ANY_ROLE,
  'POST /api/auth/password': ANY_ROLE,
  'POST /api/auth/signing-pin': ANY_ROLE,

  // mail (the durable e-mail queue)
  'GET /api/mail/jobs': ADMIN,

  // users
  'GET /api/users': ADMIN,
  'GET /api/users/crew': ANY_ROLE,
  'POST /api/users/invitations': ADMIN,
  'PATCH /api/users/:id': ADMIN,

  // live channel
  'POST /api/live/notices': ADMIN_CHIEF,

  // engines and units
  'GET /api/engines': ANY_ROLE,
  'POST /api/engines': CHIEF,
  'GET /api/engines/:id': ANY_ROLE,
  'PUT /api/engines/:id': CHIEF,
  'GET /api/engines/:id/limit-changes': ANY_ROLE,
  'GET /api/units/conversions': ANY_ROLE,

  // alarms
  'GET /api/alarms': ANY_ROLE,
  'POST /api/alarms/:id/acknowledge': ENGINE_CREW,
  'POST /api/alarms/:id/shelve': ENGINE_CREW,
  'POST /api/alarms/:id/unshelve': ENGINE_CREW,

  // runs and readings
  'GET /api/runs': ANY_ROLE,
  'POST /api/runs': ENGINE_CREW,
  'GET /api/runs/:id': ANY_ROLE,
  'PATCH /api/runs/:id': ENGINE_CREW,
  'POST /api/runs/:id/transitions': ENGINE_CREW,
  'GET /api/runs/:id/start-gate': ANY_ROLE,
  'GET /api/runs/:id/readings': ANY_ROLE,
  'GET /api/runs/:id/board': ANY_ROLE,
  'GET /api/runs/:id/alarms': ANY_ROLE,
  'GET /api/runs/:id/alarm-figures': ['chief_engineer', 'maintenance_lead'],
  'GET /api/runs/alarm-figures': ['chief_engineer', 'maintenance_lead'],
  'POST /api/runs/:id/rounds': ENGINE_CREW,
  'POST /api/runs/:id/imports': ENGINE_CREW,
  'GET /api/runs/:id/readings.csv': ANY_ROLE,
  'GET /api/runs/:id/log-sheet.pdf': ANY_ROLE,
  // The works' settings (name, time zone of printed records, wet-signature block)
  'GET /api/site/settings': ANY_ROLE,
  'PUT /api/site/settings': ADMIN,
  'POST /api/readings/:id/amendments': ENGINE_CREW,

  // data loggers
  'GET /api/loggers': ADMIN_CHIEF,
  'POST /api/loggers': ADMIN,
  'POST /api/loggers/:id/revoke': ADMIN,
  'POST /api/logger/readings': 'logger-key',

  // checklists: templates
  'GET /api/checklist-templates': ANY_ROLE,
  'POST /api/checklist-templates': CHIEF,
  'GET /api/checklist-templates/:id': ANY_ROLE,
  'GET /api/checklist-templates/:id/versions/:version': ANY_ROLE,
  'PUT /api/checklist-templates/:id/draft': CHIEF,
  'DELETE /api/checklist-templates/:id/draft': CHIEF,
  'POST /api/checklist-templates/:id/issue': CHIEF,
  'POST /api/checklist-templates/:id/withdraw': CHIEF,
  'POST /api/checklist-templates/:id/reissue': CHIEF,
  'GET /api/checklist-templates/:id/blank.pdf': ANY_ROLE,
  'GET /api/checklist-templates/:id/versions/:version/blank.pdf': ANY_ROLE,

  // checklists of a run
  'GET /api/runs/:id/checklists': ANY_ROLE,
  'POST /api/runs/:id/checklists': ENGINE_CREW,
  'GET /api/checklists/:id': ANY_ROLE,
  'PUT /api/checklists/:id/items/:itemKey': ENGINE_CREW,
  'PUT /api/checklists/:id/items/:itemKey/photo': ENGINE_CREW,
  'GET /api/checklists/:id/items/:itemKey/photo': ANY_ROLE,
  'POST /api/checklists/:id/items/:itemKey/override': CHIEF,
  'POST /api/checklists/:id/sign': ENGINE_CREW,
  'POST /api/checklists/:id/amendments': ENGINE_CREW,

  // qualifications
  'GET /api/qualifications/mine': ANY_ROLE,
  'GET /api/qualifications': ADMIN_CHIEF,
  'GET /api/qualifications/matrix': ADMIN_CHIEF,
  'POST /api/qualifications': CHIEF,
  'POST /api/qualifications/:id/renew': CHIEF,
  'POST /api/qualifications/:id/withdraw': CHIEF,

  // visitor boards (modules/visit): the chief engineer manages them; the visitors' routes are public and read only
  'GET /api/visitor-boards': CHIEF,
  'POST /api/visitor-boards': CHIEF,
  'PATCH /api/visitor-boards/:id': CHIEF,
  'POST /api/visitor-boards/:id/slug': CHIEF,
  'PUT /api/visitor-boards/:id/photo': CHIEF,
  'GET /api/visitor-boards/:id/photo': CHIEF,
  'DELETE /api/visitor-boards/:id/photo': CHIEF,
  'GET /api/visit/:slug': 'public',
  'GET /api/visit/:slug/photo': 'public',

  // indicator cards (modules/indicator-cards)
  'POST /api/calculations/indicated-power': ANY_ROLE,
  'POST /api/calculations/indicator-trace': ANY_ROLE,
  'POST /api/calculations/indicator-autotrace': ANY_ROLE,
  'GET /api/runs/:runId/card-sets': ANY_ROLE,
  'POST /api/runs/:runId/card-sets': ENGINE_CREW,
  'POST /api/runs/:runId/card-sets/preview': ENGINE_CREW,
  'GET /api/card-sets/:id': ANY_ROLE,
  'POST /api/card-sets/:id/cards': ENGINE_CREW,
  'POST /api/card-sets/:id/amendments': ENGINE_CREW,
  'POST /api/cards/:id/amendments': ENGINE_CREW,
  'POST /api/runs/:runId/card-images': ENGINE_CREW,
  'GET /api/card-images/:id': ANY_ROLE,
  'GET /api/runs/:runId/brake-figures': ANY_ROLE,
  'POST /api/runs/:runId/brake-figures': ENGINE_CREW,
  'POST /api/brake-figures/:id/amendments': ENGINE_CREW,

  // maintenance (modules/maintenance): everyone reads; the maintenance lead and the chief engineer write
  'GET /api/maintenance/bearings': ANY_ROLE,
  'GET /api/maintenance/bearings/:id/history': ANY_ROLE,
  'GET /api/maintenance/bearings/:id/history.csv': ANY_ROLE,
  'GET /api/maintenance/bearings/:id/history.pdf': ANY_ROLE,
  'GET /api/maintenance/due': ANY_ROLE,
  'GET /api/maintenance/plans': ANY_ROLE,
  'GET /api/maintenance/plans/:id': ANY_ROLE,
  'POST /api/maintenance/plans': ['maintenance_lead', 'chief_engineer'],
  'PATCH /api/maintenance/plans/:id': ['maintenance_lead', 'chief_engineer'],
  'GET /api/maintenance/inspections': ANY_ROLE,
  'GET /api/maintenance/inspections/:id': ANY_ROLE,
  'POST /api/maintenance/inspections': ['maintenance_lead', 'chief_engineer'],
  'POST /api/maintenance/inspections/:id/attachments': ['maintenance_lead', 'chief_engineer'],
  'GET /api/maintenance/attachments/:id/content': ANY_ROLE,
  'GET /api/maintenance/work-records': ANY_ROLE,
  'GET /api/maintenance/work-records/:id': ANY_ROLE,
  'POST /api/maintenance/work-records': ['maintenance_lead', 'chief_engineer'],
  'PATCH /api/maintenance/work-records/:id': ['maintenance_lead', 'chief_engineer'],
  'POST /api/maintenance/work-records/:id/close': ['maintenance_lead', 'chief_engineer'],

  // lubrication (modules/lubrication)
  'GET /api/lubrication/oils': ANY_ROLE,
  'POST /api/lubrication/oils': ['maintenance_lead', 'chief_engineer'],
  'PUT /api/lubrication/oils/:id': ['maintenance_lead', 'chief_engineer'],
  'PUT /api/lubrication/points/:id/oil': ['maintenance_lead', 'chief_engineer'],
  'POST /api/lubrication/consumption': ['operator', 'maintenance_lead', 'chief_engineer'],
  'GET /api/lubrication/engines/:id': ANY_ROLE,
  'GET /api/lubrication/engines/:id/bearings': ANY_ROLE,
  'POST /api/calculations/oil-viscosity': ANY_ROLE,
  'POST /api/calculations/journal-friction': ANY_ROLE,
  'POST /api/calculations/lift-pressure': ANY_ROLE,
  'POST /api/calculations/jack-capacity': ANY_ROLE,

  // mill (modules/mill): everyone reads; the mill lead and the chief engineer write (MILL_WRITERS)
  'POST /api/calculations/rolling-pass': ANY_ROLE,
  'GET /api/mill/mills': ANY_ROLE,
  'GET /api/mill/mills/:id': ANY_ROLE,
  'POST /api/mill/mills': MILL,
  'PUT /api/mill/mills/:id': MILL,
  'GET /api/mill/schedules': ANY_ROLE,
  'GET /api/mill/schedules/:id': ANY_ROLE,
  'POST /api/mill/schedules': MILL,
  'PUT /api/mill/schedules/:id': MILL,
  'POST /api/mill/schedules/:id/copies': MILL,
  'GET /api/mill/lots': ANY_ROLE,
  'GET /api/mill/lots/:id': ANY_ROLE,
  'POST /api/mill/lots': MILL,
  'PATCH /api/mill/lots/:id': MILL,
  'POST /api/mill/lots/:id/transitions': MILL,
  'POST /api/mill/lots/:id/runs': MILL,
  'DELETE /api/mill/lots/:id/runs/:runId': MILL,
  'GET /api/mill/lots/:id/quotes': MONEY_READERS,
  'POST /api/mill/lots/:id/quotes': MILL,
  'GET /api/mill/quotes/:id/quote.pdf': MONEY_READERS,
  'POST /api/mill/quotes/:id/send': MILL,

  // payments (operators and the maintenance lead see no money)
  'GET /api/payments/lots/:id': MONEY_READERS,
  'POST /api/payments/lots/:id/requests': ['administrator', 'mill_lead'],
  'POST /api/payments/:id/refunds': ADMIN,
  'GET /api/payments/outstanding': ADMIN,
  'POST /api/payments/webhook': 'public',
  'GET /api/payments/thanks': 'public',
  'GET /api/mill/runs': ANY_ROLE,
  'GET /api/mill/runs/:runId': ANY_ROLE,
  'GET /api/mill/runs/:runId/timeline': ANY_ROLE,
  'POST /api/mill/runs/:runId/bars': MILL,
  'PATCH /api/mill/bars/:id': MILL,
  'POST /api/mill/bars/:id/passes': MILL,
};

/**
 * Socket events of the live channel (every @SubscribeMessage of a gateway must have a row). A connection
 * without a token or with an expired one is refused before any event; a signed-in role that may not send
 * an event gets ack { ok: false, status: 403 } and a live:error event.
 * Joining a room is one row per room kind: 'room:join <example room>' ("<uuid>" stands for any id); every
 * rule of ROOM_RULES (modules/live/room-rules.ts) needs a row.
 * `payload` is a well-formed request for the event (ids unknown), so that an allowed role gets past the
 * validation and the role check and is answered from the data (ok, or 404/409).
 */
export interface SocketAccess {
  roles: readonly Role[];
  payload: (uuid: () => string) => unknown;
}

export const SOCKET_ACCESS: Record<string, SocketAccess> = {
  'room:join site': { roles: ANY_ROLE, payload: () => ({ room: 'site' }) },
  'room:join run:<uuid>': { roles: ANY_ROLE, payload: (id) => ({ room: `run:${id()}` }) },
  'room:join engine:<uuid>': { roles: ANY_ROLE, payload: (id) => ({ room: `engine:${id()}` }) },
  'room:join administration': { roles: ADMIN, payload: () => ({ room: 'administration' }) },
  'room:join money': { roles: MONEY_READERS, payload: () => ({ room: 'money' }) },
  'room:leave': { roles: ANY_ROLE, payload: () => ({ room: 'site' }) },
  'readings:submit': {
    roles: ENGINE_CREW,
    payload: (id) => ({ runId: id(), readings: [{ clientId: id(), pointCode: 'X', value: 1, takenAt: new Date().toISOString() }] }),
  },
  'run:start': { roles: ENGINE_CREW, payload: (id) => ({ runId: id() }) },
};
