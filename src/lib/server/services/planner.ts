/**
 * The crop-change planner on the server: gathers what the pure planner needs for a machine —
 * its family and catalog, what is installed, the owning organisation's shelf — proposes the plan,
 * and turns an accepted plan into a saved layout version.
 */
import { eq } from 'drizzle-orm';
import { z } from 'zod';
import { getDb } from '~/lib/server/db';
import { stock } from '~/db/schema';
import { cropPrograms } from '~/lib/domain/crops';
import { checkLayout } from '~/lib/domain/rules';
import { cropIdSchema, type Layout } from '~/lib/domain/schemas';
import { planCropChange, planModeSchema, planSummaryWords, type Plan, type PlanOk } from '~/lib/domain/planner';
import type { Actor } from '~/lib/server/access';
import { HttpError, whenNotFound } from '~/lib/server/http';
import { createLayout, getLayout, saveVersion } from './layouts';
import { catalogForFamily, installedLayout, machineForActor } from './machines';
import { currencyFor } from './prices';
import { dealerStockFor } from './stock';
import { isoDay } from '~/lib/domain/format';
import {
  purchaseAvailability,
  stepAvailability,
  workStart,
  type PartAvailability,
  type WorkStart,
} from '~/lib/domain/planner/availability';

export const planRequestSchema = z.object({
  machineId: z.uuid(),
  crop: cropIdSchema,
  mode: planModeSchema.default('program'),
});
export type PlanRequest = z.infer<typeof planRequestSchema>;

export const acceptPlanSchema = planRequestSchema
  .extend({
    /** The proposal the user looked at; if the plan has changed since, nothing is saved (409). */
    fingerprint: z
      .string()
      .regex(/^[0-9a-f]{8}$/, 'the fingerprint of the proposal you saw')
      .optional(),
    /** Save as a new version of this layout of the machine; without it a new layout is made. */
    layoutId: z.uuid().optional(),
    baseVersion: z.int32().min(1).optional(),
    name: z.string().trim().min(1).max(120).optional(),
    note: z.string().max(500).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.layoutId && !v.baseVersion)
      ctx.addIssue({ code: 'custom', path: ['baseVersion'], message: 'give the version of the layout you started from' });
  });
export type AcceptPlan = z.infer<typeof acceptPlanSchema>;

/** An organisation's shelf: part number → quantity on hand. */
export async function shelfOf(orgId: string): Promise<Record<string, number>> {
  const db = await getDb();
  const rows = await db.select({ partNumber: stock.partNumber, quantity: stock.quantity }).from(stock).where(eq(stock.orgId, orgId));
  return Object.fromEntries(rows.filter((r) => r.quantity > 0).map((r) => [r.partNumber, r.quantity]));
}

/** Everything the planner needs for one machine the actor may see. */
export async function planInputs(actor: Actor, machineId: string) {
  const ctx = await machineForActor(actor, machineId);
  const [catalog, installed, shelf, dealerStock] = await Promise.all([
    catalogForFamily(ctx.family.id, undefined, ctx.machine.orgId),
    installedLayout(ctx.machine.id),
    shelfOf(ctx.machine.orgId),
    dealerStockFor(ctx.machine.orgId),
  ]);
  return { ...ctx, catalog, installed: installed?.layout ?? null, shelf, dealerStock };
}

type PlanInputs = Awaited<ReturnType<typeof planInputs>>;

/** Where each purchase comes from (the owner's dealer's shelf or an order) and when the work can start. */
export interface PlanSupply {
  availability: PartAvailability[];
  start: WorkStart;
}

/**
 * The plan for one mode, its steps told where each purchase comes from. Availability does not
 * change which plan is best (only the words and order of getting the parts), so the plan is
 * made once to learn its purchases and once more with their availability for the steps.
 */
function planFor(
  actor: Actor,
  inputs: PlanInputs,
  crop: PlanRequest['crop'],
  mode: PlanRequest['mode'],
  today: string,
): { plan: Plan; supply: PlanSupply | null } {
  const request = {
    family: inputs.family,
    catalog: inputs.catalog,
    installed: inputs.installed,
    shelf: inputs.shelf,
    crop,
    mode,
    drum: inputs.machine.drum,
    vaneControl: inputs.machine.vaneControl,
    units: actor.unitSystem,
  };
  const first = planCropChange(request);
  if (!first.ok) return { plan: first, supply: null };
  const availability = purchaseAvailability(first.purchases, inputs.dealerStock);
  const supply = { availability, start: workStart(availability, today) };
  if (first.purchases.length === 0) return { plan: first, supply };
  return { plan: planCropChange({ ...request, availability: stepAvailability(availability, today) }), supply };
}

/**
 * Both ways of doing a crop change, for choosing side by side: following the crop program and
 * using what is on hand first, each with where its purchases come from and when it can start.
 */
export async function proposeBothModes(actor: Actor, input: Omit<PlanRequest, 'mode'>) {
  const inputs = await planInputs(actor, input.machineId);
  const today = isoDay(new Date());
  return planModeSchema.options.map((mode) => {
    return { mode, ...planFor(actor, inputs, input.crop, mode, today) };
  });
}

export async function proposePlan(actor: Actor, input: PlanRequest) {
  const inputs = await planInputs(actor, input.machineId);
  const currency = await currencyFor(inputs.machine.orgId);
  const today = isoDay(new Date());
  const { plan, supply } = planFor(actor, inputs, input.crop, input.mode, today);
  return {
    machine: {
      id: inputs.machine.id,
      nickname: inputs.machine.nickname,
      serial: inputs.machine.serial,
      orgId: inputs.machine.orgId,
      orgName: inputs.orgName,
      familyId: inputs.family.id,
      familyName: inputs.family.name,
      drum: inputs.machine.drum,
      vaneControl: inputs.machine.vaneControl,
    },
    installed: inputs.installed,
    installedFindings: inputs.installed ? checkLayout(inputs.family, inputs.catalog, inputs.installed) : [],
    shelf: inputs.shelf,
    plan,
    /** The plan's purchases on the dealer's shelf or to order, and the first day the work can start. */
    supply,
    /** ISO 4217 code of the plan's prices (the dealer's). */
    currency,
    // For the diagram beside the plan (server pages); the API leaves these out.
    family: inputs.family,
    catalog: inputs.catalog,
  };
}

/** A proposal that exists, or a 422 saying why none does. */
export function requirePlan(plan: Plan): PlanOk {
  if (!plan.ok)
    throw new HttpError(
      422,
      `No plan is possible for ${cropPrograms[plan.crop].name.toLowerCase()} on this machine: ${plan.reasons[0]!.message}`,
      'crop',
      {
        reasons: plan.reasons,
      },
    );
  return plan;
}

function planNote(installed: Layout | null, plan: PlanOk): string {
  const from = installed ? cropPrograms[installed.crop].name.toLowerCase() : 'an empty cage';
  return `Crop-change plan from ${from} to ${cropPrograms[plan.crop].name.toLowerCase()}${plan.mode === 'on-hand' ? ' (parts on hand first)' : ''}. ${planSummaryWords(plan)}`;
}

/**
 * Accepting a plan saves its layout: as a new version of one of the machine's layouts, or as a
 * new layout. The plan is worked out again here from what is stored now; if it differs from
 * the one the user saw (fingerprint), nothing is saved and the new proposal comes back (409).
 */
export async function acceptPlan(actor: Actor, input: AcceptPlan) {
  const proposal = await proposePlan(actor, input);
  const plan = requirePlan(proposal.plan);
  if (input.fingerprint && input.fingerprint !== plan.fingerprint) {
    throw new HttpError(
      409,
      'What is installed or on the shelf has changed since you looked: here is the new proposal. Nothing was saved.',
      'fingerprint',
      {
        fingerprint: plan.fingerprint,
        plan,
      },
    );
  }
  const note = input.note?.trim() || planNote(proposal.installed, plan);
  if (input.layoutId) {
    const { layout } = await getLayout(actor, input.layoutId).catch(whenNotFound(() => new HttpError(404, 'Layout not found', 'layoutId')));
    if (layout.machineId !== proposal.machine.id) throw new HttpError(400, 'layoutId: that layout belongs to another machine', 'layoutId');
    const version = await saveVersion(actor, layout.id, { baseVersion: input.baseVersion!, body: plan.layout, note });
    return { layoutId: layout.id, version: version.version, machineId: proposal.machine.id, created: false, plan };
  }
  const name = input.name ?? `${cropPrograms[plan.crop].name} plan`;
  const created = await createLayout(actor, proposal.machine.id, { name, body: plan.layout, note });
  return { layoutId: created.layout.id, version: created.version.version, machineId: proposal.machine.id, created: true, plan };
}

export const editorUrl = (machineId: string, layoutId: string) => `/machines/${machineId}/layouts/${layoutId}`;
