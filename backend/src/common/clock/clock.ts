import { Global, Module } from '@nestjs/common';

/** Where the server reads the time: injected, so tests (and jobs) can move it. */
export interface Clock {
  now(): Date;
}

/** Injection token of the app's Clock. */
export const CLOCK = Symbol('CLOCK');

export const systemClock: Clock = { now: () => new Date() };

/** A clock a test sets and moves by hand. */
export class ManualClock implements Clock {
  constructor(private current: Date = new Date()) {}
  now(): Date {
    return new Date(this.current.getTime());
  }
  set(at: Date): void {
    this.current = new Date(at.getTime());
  }
  advance(ms: number): void {
    this.current = new Date(this.current.getTime() + ms);
  }
}

/** Provides CLOCK (the system clock) to every module; tests override the provider. */
@Global()
@Module({ providers: [{ provide: CLOCK, useValue: systemClock }], exports: [CLOCK] })
export class ClockModule {}
