import { requireActor, route } from '../../../lib/server/http';
import { listUsers } from '../../../lib/server/services/users';

export const GET = route(async (ctx) => ({ users: await listUsers(requireActor(ctx, ['admin'])) }));
