/** Words the job-card pages share: where a part comes from, and a status as a short tag. */
import type { jobPartSources } from '~/db/schema';

export const PART_SOURCE_WORDS: Readonly<Record<(typeof jobPartSources)[number], string>> = {
  dealer_stock: 'Dealer’s stock',
  farm_shelf: 'Farm’s shelf',
  on_order: 'On order',
};

/** Tailwind classes of a status tag: our own palette, with the word always shown beside the colour. */
export const STATUS_TAG: Readonly<Record<string, string>> = {
  planned: 'border-steel-300 bg-steel-50 text-ink',
  in_progress: 'border-iris-500 bg-iris-50 text-iris-800',
  done: 'border-crop bg-crop-soft text-ink',
  signed_off: 'border-ok bg-ok-soft text-ok',
};
