import { requireActor, route } from '~/lib/server/http';
import { listUsers } from '~/lib/server/services/users';

/** People and their roles: a dealer administrator's dealer and customer farms; everyone for the instance administrator. */
export const GET = route(async (ctx) => ({ users: await listUsers(requireActor(ctx, 'users.list')) }));
