import { Foundation1796162547067 } from './1796162547067-Foundation.js';
import { RunLog1796163443370 } from './1796163443370-RunLog.js';

/** Every migration in order. Add new ones at the end; never edit one that has been committed. */
export const MIGRATIONS: Function[] = [Foundation1796162547067, RunLog1796163443370];
