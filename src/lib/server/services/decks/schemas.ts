/** Input formats of decks, slides and deck share links (zod; the API and the pages share them). */
import { z } from 'zod';
import { cropIdSchema, layoutSchema, slugSchema } from '~/lib/domain/schemas';
import { MAX_SLIDES } from './records';

const deckTitle = z.string().trim().min(1, { error: 'give the deck a title' }).max(120);
const slideTitle = z.string().trim().min(1, { error: 'give the slide a title' }).max(160);
const notes = z.string().max(10_000);

export const createDeckSchema = z.object({ title: deckTitle });
export const updateDeckSchema = z.object({ title: deckTitle });

/** Where a slide's layout comes from: give exactly one when adding, at most one when changing. */
const layoutSource = {
  /** A saved version of a layout on a machine the author may see. */
  layoutVersionId: z.uuid().optional(),
  /** A sample layout made for teaching. */
  sampleLayout: layoutSchema.optional(),
  /** A sample started from the suggested layout for a crop on a machine family. */
  starter: z.object({ familyId: slugSchema, crop: cropIdSchema }).optional(),
};

export const addSlideSchema = z.object({ title: slideTitle, notes: notes.default(''), ...layoutSource });
export const updateSlideSchema = z.object({ title: slideTitle.optional(), notes: notes.optional(), ...layoutSource });
export const reorderSlidesSchema = z.object({
  /** Every slide id of the deck, in the new order. */
  order: z.array(z.uuid()).max(MAX_SLIDES),
});
export const createDeckShareSchema = z.object({
  label: z.string().trim().max(120).default(''),
  /** Optional end of the link's life (ISO 8601 with an offset); must lie in the future. */
  expiresAt: z.iso.datetime({ offset: true, error: 'give a date and time such as 2026-09-30T18:00:00Z' }).nullable().optional(),
});
