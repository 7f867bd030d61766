/** Job cards: step kinds and flat rates, the estimate, the status rules, the sign-off checklist. Pure. */
export * from './kinds';
export * from './estimate';
export * from './status';
export * from './checklist';
export * from './from-layout';
export * from './from-inspection';
export * from './cautions';
