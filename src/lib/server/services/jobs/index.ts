/** Job cards: made from a plan, an inspection or by hand; worked, moved on and signed off. */
export * from './schemas';
export { listJobs, getJob, assignablePeople, jobRowForActor, type JobView } from './views';
export { createJob } from './create';
export { updateJob, moveJob, signOffJob } from './work';
export { ratesForOrg, flatRateTable, setFlatRates } from './rates';
