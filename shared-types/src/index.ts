export * from './domain/roles.js';
export * from './domain/units.js';
export * from './api/common.js';
export * from './api/auth.js';
export * from './api/users.js';
export * from './events/live-events.js';
