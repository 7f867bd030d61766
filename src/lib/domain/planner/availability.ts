/**
 * Where each purchase of a plan comes from, and when the work can start. The farm's own shelf is
 * already used by the planner; what it still has to buy is either on its dealer's shelf (it can
 * be fetched today) or has to be ordered, which takes about the dealer's lead time for the part.
 *
 * Pure: the server reads the dealer's stock and passes it in as data.
 */
import { formatDate, DEFAULT_LOCALE } from '~/lib/domain/format';
import { countOf } from '~/lib/domain/words';
import type { PurchaseAvailability } from '~/lib/domain/planner/steps';

export type AvailabilitySource = 'dealer-shelf' | 'order';

/** One purchase line's availability (one per part number of the plan's purchases). */
export interface PartAvailability {
  partNumber: string;
  source: AvailabilitySource;
  /** For an order: about how many days it takes (absent: the dealer has not said). */
  leadDays?: number;
}

/** The dealer's stock of one part: how many are on its shelf, and the lead time of an order. */
export interface DealerStockLine {
  quantity: number;
  leadDays: number | null;
}

/**
 * Each purchase is on the dealer's shelf when the dealer holds at least the quantity bought;
 * otherwise the whole line is ordered (the work waits for the last part anyway).
 */
export function purchaseAvailability(
  purchases: readonly { partNumber: string; quantity: number }[],
  dealerStock: Readonly<Record<string, DealerStockLine>>,
): PartAvailability[] {
  return purchases.map(({ partNumber, quantity }) => {
    const line = Object.hasOwn(dealerStock, partNumber) ? dealerStock[partNumber] : undefined;
    if (line && line.quantity >= quantity) return { partNumber, source: 'dealer-shelf' };
    return line?.leadDays != null ? { partNumber, source: 'order', leadDays: line.leadDays } : { partNumber, source: 'order' };
  });
}

export interface WorkStart {
  /** The first day the work can start (ISO YYYY-MM-DD), or null when an order has no lead time. */
  date: string | null;
  /** Days from today to that day (the longest lead time of the orders; 0 when all is at hand). */
  waitDays: number;
  /** Part numbers ordered without a lead time. */
  unknownLead: string[];
}

/** Adds whole days to an ISO calendar day (UTC, so no daylight-saving step moves it). */
export function addDays(isoDay: string, days: number): string {
  const d = new Date(`${isoDay}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}

/** When the work can start: today if everything is at hand, else today + the longest lead time. */
export function workStart(availability: readonly PartAvailability[], today: string): WorkStart {
  const orders = availability.filter((a) => a.source === 'order');
  const unknownLead = orders.filter((a) => a.leadDays === undefined).map((a) => a.partNumber);
  const waitDays = Math.max(0, ...orders.map((a) => a.leadDays ?? 0));
  return { date: unknownLead.length ? null : addDays(today, waitDays), waitDays, unknownLead };
}

/** "on the dealer's shelf", "to order, about 5 days", "to order, lead time not given". */
export function availabilityWords(a: PartAvailability): string {
  if (a.source === 'dealer-shelf') return 'on the dealer’s shelf';
  return a.leadDays === undefined ? 'to order, lead time not given' : `to order, about ${countOf(a.leadDays, 'day')}`;
}

/** The start in words, with the date through the one date formatter. */
export function workStartWords(start: WorkStart, locale: string = DEFAULT_LOCALE): string {
  if (start.date === null)
    return `When the ordered parts arrive: ask the dealer, no lead time is given for ${start.unknownLead.join(', ')}`;
  const day = formatDate(`${start.date}T00:00:00Z`, { locale, timeZone: 'UTC' });
  if (start.waitDays === 0) return `Today, ${day}: every part is at hand`;
  return `From about ${day}, when the last order arrives (about ${countOf(start.waitDays, 'day')})`;
}

/** The steps' words for each purchase: collect from the dealer's shelf, or order with the expected day. */
export function stepAvailability(availability: readonly PartAvailability[], today: string): Record<string, PurchaseAvailability> {
  const out: Record<string, PurchaseAvailability> = {};
  for (const a of availability) {
    if (a.source === 'dealer-shelf') out[a.partNumber] = { at: 'dealer-shelf' };
    else if (a.leadDays !== undefined) out[a.partNumber] = { at: 'to-order', leadDays: a.leadDays, expectedOn: addDays(today, a.leadDays) };
  }
  return out;
}
