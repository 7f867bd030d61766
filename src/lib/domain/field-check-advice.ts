/**
 * Loss targets and the advice the field check gives on where to look next. The wording is ours;
 * each item says where it comes from ("common practice" marks a fact of the trade with no
 * published source).
 */
import { z } from 'zod';
import type { CropId } from './schemas';

/** What the operator saw in what the machine throws out. */
export const lossSignSchema = z.enum(['unthreshed', 'in-straw', 'in-chaff']);
export type LossSign = z.infer<typeof lossSignSchema>;

export const LOSS_SIGN_LABEL: Record<LossSign, string> = {
  unthreshed: 'Heads or pods with grain still in them',
  'in-straw': 'Free kernels in the straw',
  'in-chaff': 'Free kernels in the chaff',
};

export interface LossTarget {
  /** % of the expected yield lost by harvesting (header + machine). */
  pct: number;
  source: string;
}

const SMALL_GRAINS: LossTarget = {
  pct: 3,
  source: 'smallgrains.org, "How to Estimate Grain Harvest Losses" (2003): up to 3 % is acceptable',
};
const FALLBACK: LossTarget = { pct: 3, source: 'common practice, no published source' };

/** The default target for a crop, with where it comes from. */
export function lossTargetFor(crop: CropId): LossTarget {
  switch (crop) {
    case 'wheat':
    case 'barley':
    case 'oats':
      return SMALL_GRAINS;
    case 'soybeans':
      return { pct: 2.75, source: 'University of Nebraska: combine loss target 2.75 % in soybeans' };
    case 'canola':
      return { pct: 2, source: 'Saskatchewan Pulse Growers / PAMI (Barker, "Managing harvest losses"): canola under 2 %' };
    default:
      return FALLBACK;
  }
}

export type AdviceArea = 'header' | 'threshing' | 'separating' | 'cleaning' | 'general';

export interface AdviceItem {
  area: AdviceArea;
  text: string;
  source: string;
}

const COMMON = 'common practice, no published source';
const UW = 'University of Wisconsin–Madison, "Combine Adjustments" (2006, updated 2014)';

const ADVICE: Record<Exclude<AdviceArea, 'general'>, AdviceItem> = {
  header: {
    area: 'header',
    text: 'Most of the loss is at the header: look at reel speed and position against ground speed, cutting height, knife sections and guards, and how evenly the crop feeds in before touching the rotor.',
    source: `${COMMON}; Iowa State University (Hanna, 2017) finds most soybean loss at the head`,
  },
  threshing: {
    area: 'threshing',
    text: 'Grain left in heads or pods: close the concave clearance a step at a time before raising rotor speed; slower vanes or a cover plate keep the crop longer in the threshing zone.',
    source: `${UW} (clearance before speed); vanes and cover plates: ${COMMON}`,
  },
  separating: {
    area: 'separating',
    text: 'Free kernels in the straw: the rear of the cage is not letting grain through. Try slower vanes, more open separating elements, or a lower ground speed so the rotor is less loaded.',
    source: COMMON,
  },
  cleaning: {
    area: 'cleaning',
    text: 'Kernels in the chaff: lower the cleaning fan a little or open the upper sieve so grain can fall through; keep the lower sieve for clean grain only.',
    source: UW,
  },
};

/** What to look at next, from where the loss is and what the operator saw. */
export function lossAdvice(input: {
  verdict: 'within' | 'over';
  headerShare: number | null;
  machinePct: number;
  targetPct: number;
  signs: readonly LossSign[];
}): AdviceItem[] {
  const out: AdviceItem[] = [];
  if (input.headerShare === null) {
    return [{ area: 'general', text: 'No harvest loss was counted. Check again when the crop or the conditions change.', source: COMMON }];
  }
  if (input.headerShare >= 0.5) out.push(ADVICE.header);
  if (input.signs.includes('unthreshed')) out.push(ADVICE.threshing);
  if (input.signs.includes('in-straw')) out.push(ADVICE.separating);
  if (input.signs.includes('in-chaff')) out.push(ADVICE.cleaning);
  // Machine loss worth chasing but no sign recorded: say how to find where it comes from.
  if (input.headerShare < 0.5 && input.signs.length === 0) {
    out.push({
      area: 'general',
      text: 'Most of the loss comes out of the machine. Look at what it throws out: grain still in heads or pods points to threshing, free kernels in the straw to separating, kernels in the chaff to cleaning.',
      source: COMMON,
    });
  }
  if (input.verdict === 'within') {
    out.push({
      area: 'general',
      text: 'Within the target: keep these settings and check again when the crop or the conditions change.',
      source: COMMON,
    });
  }
  return out;
}
