import { EventEmitter } from 'node:events';
import { Injectable, Module } from '@nestjs/common';

/** What the users module announces about a person, for other modules to react to without importing it. */
export interface UserEventMap {
  /** The account was deactivated: whatever the person still holds open should end. */
  deactivated: [userId: string];
  /** Every session of the person ended (session version raised): open connections should close at once. */
  sessionsEnded: [userId: string];
}

/**
 * A small in-process bus for user events. The users module announces; modules that must react (the live channel
 * ends a deactivated person's connections) subscribe. Listeners run synchronously inside `announce`, as a direct
 * call would, so an error in one reaches the caller.
 */
@Injectable()
export class UserEvents {
  private readonly emitter = new EventEmitter();

  announce<E extends keyof UserEventMap>(event: E, ...args: UserEventMap[E]): void {
    this.emitter.emit(event, ...args);
  }

  on<E extends keyof UserEventMap>(event: E, listener: (...args: UserEventMap[E]) => void): () => void {
    this.emitter.on(event, listener as (...args: unknown[]) => void);
    return () => this.emitter.off(event, listener as (...args: unknown[]) => void);
  }
}

/** Provides the one UserEvents instance; import it in every module that announces or listens. */
@Module({ providers: [UserEvents], exports: [UserEvents] })
export class UserEventsModule {}
