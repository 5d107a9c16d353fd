export * from './domain/roles.js';
