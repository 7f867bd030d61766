import { requireActor, route, parseId } from '../../../../../lib/server/http';
import { listVersions } from '../../../../../lib/server/services/layouts';

export const GET = route(async (ctx) => listVersions(requireActor(ctx), parseId(ctx.params.id)));
