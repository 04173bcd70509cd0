/** The live count's pure domain: events, the reducer, what the clock makes due, commands, projections. */
export * from './events';
export * from './state';
export * from './plan';
export * from './reduce';
export * from './due';
export * from './commands';
export * from './projection';
export * from './clockSync';
export * from './report';
export * from './simulate';
export * from './timeline';
