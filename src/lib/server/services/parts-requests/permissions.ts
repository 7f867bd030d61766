/**
 * Parts requests: what an actor may do with one request (writers of its farm, its dealer's desk).
 */
import { can, type Actor } from '~/lib/server/access';
import type { Row } from './rows';
import { NEXT_STATUS } from './statuses';

export function permissions(actor: Actor, row: Pick<Row, 'status' | 'orgId' | 'dealerOrgId'>) {
  const writer = can(actor, 'parts.request') && actor.visibleOrgIds.includes(row.orgId);
  const draft = row.status === 'draft';
  const desk = can(actor, 'parts.desk') && !!row.dealerOrgId && actor.memberOrgIds.includes(row.dealerOrgId);
  return {
    edit: writer && draft,
    submit: writer && draft,
    delete: writer && draft,
    advance: desk && NEXT_STATUS[row.status] !== undefined,
  };
}
