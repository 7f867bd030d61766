import { json, readJson, requireActor, route, routeInputs } from '~/lib/server/http';
import { createFarm, createOrgSchema, listOrgs } from '~/lib/server/services/orgs';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { body: createOrgSchema } });

/** The organisations the user may see (their own, and a dealer's customer farms). */
export const GET = route(async (ctx) => ({ orgs: await listOrgs(requireActor(ctx)) }));

/** An admin adds a customer farm served by their dealer. */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'orgs.add');
  const input = await readJson(ctx.request, inputs.POST.body);
  return json({ org: await createFarm(actor, input) }, 201);
});
