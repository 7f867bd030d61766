/** The domain's public API: formats, units, places, crops, computations, rules and demo data. */
export * from './units';
export * from './schemas';
export * from './places';
export * from './crops';
export * from './catalog';
export * from './compute';
export { checkLayout, hasBlockingFindings, countBySeverity } from './rules';
export * from './layout-edits';
export * from './vocabulary';
export * from './words';
export * from './vanes';
export * from './demo-catalog';
export * from './starter';
export * from './check-input';
export * from './text';
export * from './field-check';
export * from './format';
