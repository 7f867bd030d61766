import { json, parseId, requireActor, route, routeInputs } from '~/lib/server/http';
import { addPhoto, photoTarget, photoUploadSchema, readPhotoUpload } from '~/lib/server/services/photos';

/** What each write handler reads (see RouteInputs in lib/server/http). */
export const inputs = routeInputs({ POST: { multipart: photoUploadSchema } });

/**
 * Attaches a photo to a line: multipart/form-data with the picture in a field named "photo".
 * JPEG, PNG or WebP by content, at most 8 MB (413 beyond, 415 for anything else).
 */
export const POST = route(async (ctx) => {
  const actor = requireActor(ctx, 'inspections.write');
  const id = parseId(ctx.params.id);
  const itemId = parseId(ctx.params.itemId, 'itemId');
  // Another organisation's line is not found whatever was sent; only then is the body read.
  await photoTarget(actor, id, itemId);
  const upload = await readPhotoUpload(ctx.request, inputs.POST.multipart);
  return json(await addPhoto(actor, id, itemId, upload), 201);
});
