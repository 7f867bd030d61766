/** The domain's public API: formats, units, places, crops, computations and rules. */
export * from './units';
export * from './schemas';
export * from './places';
