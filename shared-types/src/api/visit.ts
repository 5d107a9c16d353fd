/**
 * The visitor board: a public, read-only window on an engine at work for the people visiting the works.
 * The crew's side (VisitorBoardDto) is for the chief engineer; the public side (VisitorBoardView, VisitorFigures)
 * carries only what a visitor may see: never names of people, alarms, checklists, limits, maintenance, money or controls.
 */

/** A board follows one run, or an engine whenever it runs. */
export type VisitorBoardScope = 'run' | 'engine';
export const VISITOR_BOARD_SCOPES: readonly VisitorBoardScope[] = ['run', 'engine'];

/** A visitor board as the chief engineer manages it. */
export interface VisitorBoardDto {
  id: string;
  scope: VisitorBoardScope;
  engineId: string;
  /** Set for a board of one run; null for a board of the engine. */
  runId: string | null;
  /** What the board follows, in words: the run's title or the engine's name. */
  followsLabel: string;
  enabled: boolean;
  /** The unguessable part of the public address /visit/<slug>. */
  slug: string;
  /** The public address path, /visit/<slug>. */
  path: string;
  story: string;
  hasPhoto: boolean;
  updatedAt: string;
}

export interface CreateVisitorBoardRequest {
  /** A board of one run (its engine follows from it) ... */
  runId?: string;
  /** ... or of an engine, whenever it runs. Exactly one of the two. */
  engineId?: string;
}

export interface UpdateVisitorBoardRequest {
  enabled?: boolean;
  /** The short story of the engine the visitors read (plain text, at most 4000 characters). */
  story?: string;
}

/** 'working': the engine runs and all is well; 'resting': stopped, not started, or an alarm is active (no detail given). */
export type VisitorEngineState = 'working' | 'resting';

/** The figures a visitor sees: delayed by a few seconds and smoothed; the live ones are null while the engine rests. */
export interface VisitorFigures {
  state: VisitorEngineState;
  speedRpm: number | null;
  revolutionsSinceStart: number | null;
  steamPressurePsig: number | null;
  /** The same steam pressure in bar gauge, for visitors who read metric units. */
  steamPressureBar: number | null;
  /** The latest indicated horsepower measured from indicator cards on this engine (null when none yet). */
  indicatedHorsepower: number | null;
  indicatedKilowatts: number | null;
  /** The same power as a number of horses (1 hp by definition). */
  horses: number | null;
  /** The same power as a number of small car engines. */
  smallCarEngines: number | null;
  /** How far behind the engine the figures are, seconds. */
  delaySeconds: number;
  /** When the figures were worked out (ISO 8601). */
  at: string;
}

/** The public board: what /api/visit/:slug answers. */
export interface VisitorBoardView {
  slug: string;
  /** The engine's name (never a person's). */
  engineName: string;
  /** The run's title for a board of one run, else the engine's name. */
  title: string;
  story: string;
  /** Path of the story's photo, or null. */
  photoPath: string | null;
  figures: VisitorFigures;
}

/** Events of the public /visit namespace: nothing is accepted from the visitor's side. */
export interface VisitServerToClientEvents {
  'visit:figures': (figures: VisitorFigures) => void;
  /** The board was switched off or its address changed: the page stops and says so. */
  'visit:ended': (e: { message: string }) => void;
  /** Anything a visitor sends is refused with this event. */
  'visit:refused': (e: { event: string; message: string; status: number }) => void;
}
