/**
 * Prices belong to dealers. The catalog (families, parts' technical data and a list price) is
 * instance-wide and kept by instance administrators; each dealer keeps its own price list
 * (`dealer_prices`), edited by that dealer's administrator. Wherever a price is read for a farm
 * or a dealer (parts requests, planner costs, the editor's totals), the price of the dealer that
 * serves it applies, and the catalog's list price where that dealer has set none.
 */
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import Papa from 'papaparse';
import { z } from 'zod';
import { getDb, type Db } from '~/lib/server/db';
import { catalogParts, dealerPrices, organisations } from '~/db/schema';
import type { CatalogPart } from '~/lib/domain/schemas';
import { DEFAULT_CURRENCY } from '~/lib/domain/format';
import { currencyCodeSchema } from '~/lib/domain/schemas';
import { can, dealerOf, type Actor } from '~/lib/server/access';
import { audit } from '~/lib/server/audit';
import { HttpError, notFound } from '~/lib/server/http';

/** The largest price a line may carry: 10 million in whole currency units. */
const MAX_PRICE_CENTS = 1_000_000_000;
/** Rows an import may carry (a dealer's whole list fits many times over). */
const MAX_IMPORT_ROWS = 20_000;

export const priceCentsSchema = z.int().min(0).max(MAX_PRICE_CENTS);
export const setPriceSchema = z.object({ priceCents: priceCentsSchema }).strict();
export const importPricesSchema = z.object({ csv: z.string().min(1, { error: 'paste or attach a CSV file' }).max(900_000) }).strict();

type Reader = Pick<Db, 'select'>;

/** The dealer that prices parts for an organisation: itself (a dealer), its dealer (a farm), or none. */
export async function pricingDealerOf(orgId: string, db?: Reader): Promise<string | null> {
  const d = db ?? (await getDb());
  const [org] = await d
    .select({ kind: organisations.kind, dealerId: organisations.dealerId })
    .from(organisations)
    .where(eq(organisations.id, orgId))
    .limit(1);
  if (!org) return null;
  if (org.kind === 'dealer') return orgId;
  return org.kind === 'farm' ? org.dealerId : null;
}

/**
 * The currency an organisation's prices are in: its pricing dealer's (ISO 4217), else the
 * catalog's (DEFAULT_CURRENCY). Every screen, sheet, e-mail and file that shows a price shows it.
 */
export async function currencyFor(orgId: string | null | undefined, db?: Reader): Promise<string> {
  if (!orgId) return DEFAULT_CURRENCY;
  const d = db ?? (await getDb());
  const dealerId = await pricingDealerOf(orgId, d);
  if (!dealerId) return DEFAULT_CURRENCY;
  const [dealer] = await d.select({ currency: organisations.currency }).from(organisations).where(eq(organisations.id, dealerId)).limit(1);
  return dealer?.currency ?? DEFAULT_CURRENCY;
}

export const setCurrencySchema = z.object({ currency: currencyCodeSchema }).strict();

/** Sets the actor's dealer's currency (its administrator only); audited. */
export async function setDealerCurrency(actor: Actor, currency: string): Promise<string> {
  if (!can(actor, 'prices.write')) throw new HttpError(403, 'Only the dealer’s administrator changes the currency.');
  const dealerId = ownDealer(actor);
  const parsed = setCurrencySchema.safeParse({ currency });
  if (!parsed.success) throw new HttpError(400, `currency: ${parsed.error.issues[0]?.message ?? 'not a currency code'}`, 'currency');
  const code = parsed.data.currency;
  const db = await getDb();
  await db.transaction(async (tx) => {
    const [before] = await tx
      .select({ currency: organisations.currency })
      .from(organisations)
      .where(eq(organisations.id, dealerId))
      .limit(1);
    await tx.update(organisations).set({ currency: code }).where(eq(organisations.id, dealerId));
    await audit(tx, actor, 'set-currency', 'organisation', dealerId, { from: before?.currency ?? DEFAULT_CURRENCY, to: code }, dealerId);
  });
  return code;
}

/** A dealer's prices for some part numbers (all of them when none are named). */
export async function dealerPriceMap(dealerId: string, partNumbers?: readonly string[], db?: Reader): Promise<Map<string, number>> {
  const d = db ?? (await getDb());
  if (partNumbers && partNumbers.length === 0) return new Map();
  const rows = await d
    .select({ partNumber: dealerPrices.partNumber, priceCents: dealerPrices.priceCents })
    .from(dealerPrices)
    .where(
      partNumbers
        ? and(eq(dealerPrices.dealerId, dealerId), inArray(dealerPrices.partNumber, [...partNumbers]))
        : eq(dealerPrices.dealerId, dealerId),
    );
  return new Map(rows.map((r) => [r.partNumber, r.priceCents]));
}

/**
 * The catalog as an organisation buys it: each part's `priceCents` is the price of the dealer
 * serving that organisation, or the list price where the dealer set none (or there is no dealer).
 */
export async function priceCatalogFor<T extends CatalogPart>(catalog: readonly T[], orgId: string, db?: Reader): Promise<T[]> {
  const dealerId = await pricingDealerOf(orgId, db);
  if (!dealerId) return [...catalog];
  const prices = await dealerPriceMap(
    dealerId,
    catalog.map((p) => p.partNumber),
    db,
  );
  return catalog.map((p) => (prices.has(p.partNumber) ? { ...p, priceCents: prices.get(p.partNumber)! } : p));
}

function ownDealer(actor: Actor): string {
  const dealerId = dealerOf(actor);
  if (!dealerId) throw new HttpError(403, 'Price lists belong to dealers: only a dealer’s staff read one.');
  return dealerId;
}

export interface PriceListItem {
  partNumber: string;
  name: string;
  familyId: string;
  kind: CatalogPart['kind'];
  active: boolean;
  /** The catalog's list price (instance-wide). */
  listPriceCents: number;
  /** This dealer's price, or null where the list price applies. */
  dealerPriceCents: number | null;
  /** What this dealer's customers are charged. */
  priceCents: number;
}

/** The actor's dealer's price list: every catalog part with the dealer's price beside the list price. */
export async function listPriceList(
  actor: Actor,
): Promise<{ dealer: { id: string; name: string; currency: string }; items: PriceListItem[] }> {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  const [row] = await db
    .select({ id: organisations.id, name: organisations.name, currency: organisations.currency })
    .from(organisations)
    .where(eq(organisations.id, dealerId))
    .limit(1);
  if (!row) throw notFound('Dealer not found');
  const dealer = { ...row, currency: row.currency ?? DEFAULT_CURRENCY };
  const rows = await db
    .select({
      partNumber: catalogParts.partNumber,
      familyId: catalogParts.familyId,
      kind: catalogParts.kind,
      active: catalogParts.active,
      spec: catalogParts.spec,
      dealerPriceCents: dealerPrices.priceCents,
    })
    .from(catalogParts)
    .leftJoin(dealerPrices, and(eq(dealerPrices.partNumber, catalogParts.partNumber), eq(dealerPrices.dealerId, dealerId)))
    .orderBy(asc(catalogParts.familyId), asc(catalogParts.partNumber));
  return {
    dealer,
    items: rows.map((r) => ({
      partNumber: r.partNumber,
      name: r.spec.name,
      familyId: r.familyId,
      kind: r.kind,
      active: r.active,
      listPriceCents: r.spec.priceCents,
      dealerPriceCents: r.dealerPriceCents ?? null,
      priceCents: r.dealerPriceCents ?? r.spec.priceCents,
    })),
  };
}

async function requirePart(db: Reader, partNumber: string) {
  const [part] = await db
    .select({ partNumber: catalogParts.partNumber })
    .from(catalogParts)
    .where(eq(catalogParts.partNumber, partNumber))
    .limit(1);
  if (!part) throw notFound('Part not found', 'partNumber');
}

/** Sets the actor's dealer's price for one part. */
export async function setDealerPrice(actor: Actor, partNumber: string, priceCents: number) {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  await requirePart(db, partNumber);
  await db.transaction(async (tx) => {
    await tx
      .insert(dealerPrices)
      .values({ dealerId, partNumber, priceCents })
      .onConflictDoUpdate({ target: [dealerPrices.dealerId, dealerPrices.partNumber], set: { priceCents, updatedAt: sql`now()` } });
    await audit(tx, actor, 'set-price', 'dealer-price', partNumber, { priceCents }, dealerId);
  });
  return { partNumber, priceCents };
}

/** Drops the actor's dealer's price for one part: the list price applies again. */
export async function clearDealerPrice(actor: Actor, partNumber: string) {
  const dealerId = ownDealer(actor);
  const db = await getDb();
  await requirePart(db, partNumber);
  await db.transaction(async (tx) => {
    await tx.delete(dealerPrices).where(and(eq(dealerPrices.dealerId, dealerId), eq(dealerPrices.partNumber, partNumber)));
    await audit(tx, actor, 'clear-price', 'dealer-price', partNumber, {}, dealerId);
  });
  return { partNumber, priceCents: null };
}

// ---------------------------------------------------------------------------------------------
// CSV import

const PART_COLUMNS = ['part number', 'part_number', 'partnumber', 'part no', 'part'];
const PRICE_COLUMNS = ['price', 'unit price', 'unit_price', 'dealer price'];
const normalise = (h: string) =>
  h
    .replace(/^\uFEFF/, '')
    .trim()
    .toLowerCase();

export interface ImportProblem {
  /** 1-based, as a spreadsheet numbers rows: the header is row 1. */
  row: number;
  column: string;
  message: string;
}

/** "1185", "1185.5", "1,185.00" → whole cents; null when it is not an amount. */
export function parsePrice(text: string): number | null {
  const t = text.trim().replace(/,(?=\d{3}(\D|$))/g, '');
  if (!/^\d{1,8}(\.\d{1,2})?$/.test(t)) return null;
  const [whole, frac = ''] = t.split('.');
  return Number(whole) * 100 + Number(frac.padEnd(2, '0'));
}

/**
 * Reads a price list from CSV (papaparse): a header row with a part-number column and a price
 * column (amounts in currency units with up to two decimals). Every problem is named by row and
 * column; with any problem nothing is written. Parts not in the file keep their price.
 */
export async function importPriceList(actor: Actor, csv: string) {
  const dealerId = ownDealer(actor);
  const parsed = Papa.parse<string[]>(csv, { skipEmptyLines: 'greedy' });
  const problems: ImportProblem[] = [];
  const rows = parsed.data;
  const header = (rows[0] ?? []).map(normalise);
  const partCol = header.findIndex((h) => PART_COLUMNS.includes(h));
  const priceCol = header.findIndex((h) => PRICE_COLUMNS.includes(h));
  if (partCol < 0) problems.push({ row: 1, column: 'part number', message: 'the header row needs a “part number” column' });
  if (priceCol < 0) problems.push({ row: 1, column: 'price', message: 'the header row needs a “price” column' });
  // A one-column file makes papaparse guess the delimiter and warn; a comma it is.
  for (const e of parsed.errors.filter((x) => x.type !== 'Delimiter').slice(0, 20))
    problems.push({ row: (e.row ?? 0) + 1, column: '', message: `the file is not valid CSV here (${e.message})` });
  if (rows.length - 1 > MAX_IMPORT_ROWS)
    problems.push({ row: MAX_IMPORT_ROWS + 2, column: '', message: `at most ${MAX_IMPORT_ROWS} rows in one import` });
  if (rows.length < 2 && partCol >= 0 && priceCol >= 0)
    problems.push({ row: 2, column: 'part number', message: 'the file has no rows under its header' });
  if (problems.length) throw importError(problems);

  const db = await getDb();
  const known = new Set((await db.select({ p: catalogParts.partNumber }).from(catalogParts)).map((r) => r.p));
  const seen = new Map<string, number>();
  const values: { partNumber: string; priceCents: number }[] = [];
  rows.slice(1).forEach((cells, i) => {
    const row = i + 2;
    const partNumber = (cells[partCol] ?? '').trim();
    const priceText = cells[priceCol] ?? '';
    if (!partNumber) problems.push({ row, column: 'part number', message: 'empty' });
    else if (!known.has(partNumber))
      problems.push({ row, column: 'part number', message: `${partNumber.slice(0, 40)} is not in the catalog` });
    else if (seen.has(partNumber))
      problems.push({ row, column: 'part number', message: `${partNumber} is already priced on row ${seen.get(partNumber)}` });
    else seen.set(partNumber, row);
    const priceCents = parsePrice(priceText);
    if (priceCents === null)
      problems.push({
        row,
        column: 'price',
        message: priceText.trim() ? `“${priceText.trim().slice(0, 20)}” is not an amount (e.g. 1185.00)` : 'empty',
      });
    else if (priceCents > MAX_PRICE_CENTS) problems.push({ row, column: 'price', message: 'too large' });
    if (partNumber && priceCents !== null) values.push({ partNumber, priceCents });
  });
  if (problems.length) throw importError(problems);

  await db.transaction(async (tx) => {
    for (let i = 0; i < values.length; i += 500) {
      await tx
        .insert(dealerPrices)
        .values(values.slice(i, i + 500).map((v) => ({ dealerId, ...v })))
        .onConflictDoUpdate({
          target: [dealerPrices.dealerId, dealerPrices.partNumber],
          set: { priceCents: sql`excluded.price_cents`, updatedAt: sql`now()` },
        });
    }
    await audit(tx, actor, 'import-prices', 'dealer-price', null, { rows: values.length }, dealerId);
  });
  return { imported: values.length };
}

function importError(problems: ImportProblem[]): HttpError {
  const first = problems[0]!;
  const where = `row ${first.row}${first.column ? `, column ${first.column}` : ''}`;
  const more = problems.length > 1 ? ` (and ${problems.length - 1} more)` : '';
  return new HttpError(400, `csv: ${where}: ${first.message}${more}; nothing was imported`, 'csv', { problems: problems.slice(0, 100) });
}

/**
 * Saves the price list page: for each part number, a price in currency units, or blank for the
 * list price. Only the entries that differ from what is stored are written, in one transaction;
 * a bad amount is named by its part number and nothing is written.
 */
export async function savePriceTable(actor: Actor, entries: Record<string, string>) {
  const current = await listPriceList(actor);
  const dealerId = current.dealer.id;
  const byNumber = new Map(current.items.map((i) => [i.partNumber, i]));
  const errors: Record<string, string> = {};
  const set: { partNumber: string; priceCents: number }[] = [];
  const clear: string[] = [];
  for (const [partNumber, text] of Object.entries(entries)) {
    const item = byNumber.get(partNumber);
    if (!item) {
      errors[partNumber] = 'not in the catalog';
      continue;
    }
    if (!text.trim()) {
      if (item.dealerPriceCents !== null) clear.push(partNumber);
      continue;
    }
    const cents = parsePrice(text);
    if (cents === null || cents > MAX_PRICE_CENTS) errors[partNumber] = `“${text.trim().slice(0, 20)}” is not an amount (e.g. 1185.00)`;
    else if (cents !== item.dealerPriceCents) set.push({ partNumber, priceCents: cents });
  }
  if (Object.keys(errors).length) return { ok: false as const, errors };
  if (!set.length && !clear.length) return { ok: true as const, changed: 0 };
  const db = await getDb();
  await db.transaction(async (tx) => {
    if (set.length)
      await tx
        .insert(dealerPrices)
        .values(set.map((v) => ({ dealerId, ...v })))
        .onConflictDoUpdate({
          target: [dealerPrices.dealerId, dealerPrices.partNumber],
          set: { priceCents: sql`excluded.price_cents`, updatedAt: sql`now()` },
        });
    if (clear.length)
      await tx.delete(dealerPrices).where(and(eq(dealerPrices.dealerId, dealerId), inArray(dealerPrices.partNumber, clear)));
    await audit(tx, actor, 'save-prices', 'dealer-price', null, { set: set.length, cleared: clear.length }, dealerId);
  });
  return { ok: true as const, changed: set.length + clear.length };
}
