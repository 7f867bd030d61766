/** The domain's public API: formats, units, places, crops, computations, rules and demo data. */
export * from './units';
export * from './schemas';
export * from './places';
export * from './crops';
export * from './catalog';
export * from './compute';
export { checkLayout, checkPlacement, placePart, hasBlockingFindings, countBySeverity } from './rules';
export * from './demo-catalog';
export * from './starter';
export * from './check-input';
export * from './text';
export * from './field-check';
export * from './format';
