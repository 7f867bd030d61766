/** Parts requests: the statuses and sources, their words, and the desk's next step. */
import { withArticle } from '~/lib/domain/words';
import { partsRequestStatuses } from '~/db/schema';

export type PartsRequestStatus = (typeof partsRequestStatuses)[number];
export type PartsRequestSource = 'plan' | 'layout' | 'inspection' | 'manual';

export const NEXT_STATUS: Partial<Record<PartsRequestStatus, PartsRequestStatus>> = {
  sent: 'acknowledged',
  acknowledged: 'ready',
  ready: 'picked-up',
};

export const STATUS_WORDS: Record<PartsRequestStatus, string> = {
  draft: 'Draft',
  sending: 'Being sent',
  sent: 'Sent to the parts desk',
  acknowledged: 'Acknowledged',
  ready: 'Ready for pick-up',
  'picked-up': 'Picked up',
};

export const SOURCE_WORDS: Record<PartsRequestSource, string> = {
  plan: 'crop-change plan',
  layout: 'saved layout',
  inspection: 'inspection',
  manual: 'entered by hand',
};

/** Where a request came from, as a phrase: "from an inspection", "entered by hand". */
export const sourceOrigin = (source: PartsRequestSource): string =>
  source === 'manual' ? SOURCE_WORDS.manual : `from ${withArticle(SOURCE_WORDS[source])}`;

export const requestNumber = (id: string) => `PR-${id.slice(0, 8).toUpperCase()}`;
