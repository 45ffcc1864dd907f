export * from './errors';
export * from './enums';
export * from './health';
export * from './baselines';
export * from './limits';
export * from './booking';
export * from './units';
export * from './accounts';
