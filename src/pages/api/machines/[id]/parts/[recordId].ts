import { parseId, requireActor, route } from '~/lib/server/http';
import { partRecordDetail } from '~/lib/server/services/part-history';

/** One part record: install and removal, the part's earlier records, its wear measurements and forecast. */
export const GET = route(async (ctx) =>
  partRecordDetail(requireActor(ctx, 'shop.view'), parseId(ctx.params.id), parseId(ctx.params.recordId, 'recordId')),
);
