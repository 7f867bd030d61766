import { and, asc, eq } from 'drizzle-orm';
import { partsRequests, type PartsRequestLine } from '../../../db/schema';
import type { Db } from '../db';
import type { Actor } from '../access';
import { audit } from '../audit';

type Tx = Pick<Db, 'select' | 'insert' | 'update'>;

export interface DraftLinesInput {
  orgId: string;
  dealerOrgId: string | null;
  machineId: string;
  source: 'inspection';
  lines: PartsRequestLine[];
  note: string;
}

/**
 * Adds replacement lines to the machine's open draft request of the same source, or starts one.
 * Equal part numbers add up. Runs inside the caller's transaction and audits the change.
 */
export async function addLinesToDraftRequest(tx: Tx, actor: Pick<Actor, 'id' | 'homeOrgId'>, input: DraftLinesInput): Promise<{ id: string }> {
  const [draft] = await tx
    .select()
    .from(partsRequests)
    .where(
      and(
        eq(partsRequests.orgId, input.orgId),
        eq(partsRequests.machineId, input.machineId),
        eq(partsRequests.status, 'draft'),
        eq(partsRequests.source, input.source),
      ),
    )
    .orderBy(asc(partsRequests.createdAt))
    .limit(1);
  if (draft) {
    const merged = mergeLines(draft.lines, input.lines);
    const note = draft.note ? `${draft.note}\n${input.note}` : input.note;
    await tx.update(partsRequests).set({ lines: merged, note, updatedAt: new Date() }).where(eq(partsRequests.id, draft.id));
    await audit(tx, actor, 'add-lines', 'parts-request', draft.id, { source: input.source, lines: input.lines }, input.orgId);
    return { id: draft.id };
  }
  const [created] = await tx
    .insert(partsRequests)
    .values({
      orgId: input.orgId,
      dealerOrgId: input.dealerOrgId,
      machineId: input.machineId,
      source: input.source,
      status: 'draft',
      lines: mergeLines([], input.lines),
      note: input.note,
      createdBy: actor.id,
    })
    .returning({ id: partsRequests.id });
  await audit(tx, actor, 'create', 'parts-request', created!.id, { source: input.source, lines: input.lines }, input.orgId);
  return { id: created!.id };
}

export function mergeLines(existing: readonly PartsRequestLine[], added: readonly PartsRequestLine[]): PartsRequestLine[] {
  const out = existing.map((l) => ({ ...l }));
  for (const l of added) {
    const same = out.find((o) => o.partNumber === l.partNumber);
    if (same) same.quantity += l.quantity;
    else out.push({ ...l });
  }
  return out;
}
