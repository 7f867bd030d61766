/**
 * Parts requests: a bill of materials a farm (or its dealer's technician on its behalf) sends to
 * the dealer's parts desk. Made from a crop-change plan, from a saved layout (what it needs
 * beyond what is installed and on the shelf), from inspection findings, or by hand. A draft can
 * be edited and deleted; submitting is an outbox: the request is `sending` while the mail server
 * is asked, `sent` once it accepted (only then may the desk act), and back to `draft` with the
 * reason if it failed; the dealer's technicians then move it through acknowledged → ready →
 * picked up. A request left `sending` by a crash is returned to draft (`recoverStuckSends`).
 *
 * Lines keep the description and unit price the catalog had when they were added, so a sent
 * request reads the same later; part numbers are always checked against the machine's catalog.
 */
export {
  type PartsRequestStatus,
  type PartsRequestSource,
  NEXT_STATUS,
  STATUS_WORDS,
  SOURCE_WORDS,
  sourceOrigin,
  requestNumber,
} from './statuses';
export {
  lineInputSchema,
  type LineInput,
  createPartsRequestSchema,
  overrideReasonSchema,
  type CreatePartsRequest,
  updatePartsRequestSchema,
  statusChangeSchema,
  listQuerySchema,
} from './schemas';
export { type PartsRequestView, getPartsRequest, listPartsRequests } from './views';
export {
  linesFromInput,
  requestSettingsWords,
  createPartsRequest,
  addLinesToDraftRequest,
  updatePartsRequest,
  deletePartsRequest,
} from './drafts';
export { partsRequestCsv, csvFileName } from './csv';
export { fitFindingWords } from './fit';
export { submitPartsRequest, STUCK_SEND_REASON, recoverStuckSends } from './sending';
export { advancePartsRequest } from './desk';
export { requestLayoutChoices } from './choices';
