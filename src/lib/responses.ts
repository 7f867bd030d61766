/**
 * Answers the server gives and the islands read: one type per answer, declared once here and
 * used on both sides. A server type holds `Date`s; what an island receives is `Json<T>` of it,
 * the same shape with dates as ISO strings. Type imports only, so the browser may read it.
 */
import type { Layout } from './domain/schemas';

/** What JSON makes of a server value: dates become ISO strings, everything else keeps its shape. */
export type Json<T> = T extends Date
  ? string
  : T extends (infer U)[]
    ? Json<U>[]
    : T extends readonly (infer U)[]
      ? readonly Json<U>[]
      : T extends object
        ? { [K in keyof T]: Json<T[K]> }
        : T;

/** One saved version of a layout (`GET /api/layouts/:id/versions/:n`, the 409 of a save). */
export interface VersionView {
  id: string;
  version: number;
  body: Layout;
  note: string;
  createdAt: Date;
  createdBy: string | null;
  createdByName: string | null;
}

/** Where a classroom slide's layout comes from. */
export type SlideSource =
  | {
      kind: 'version';
      layoutVersionId: string;
      layoutId: string;
      layoutName: string;
      version: number;
      machineId: string;
      machineNickname: string;
      orgName: string;
    }
  | { kind: 'sample' }
  /** The layout was deleted, or its farm is no longer one the viewer may see. */
  | { kind: 'missing' };

/** A classroom slide as the deck API answers and the deck editor shows it. */
export interface SlideRecord {
  id: string;
  position: number;
  title: string;
  notes: string;
  /** The talking points rendered to safe HTML (see markdown.ts). */
  notesHtml: string;
  source: SlideSource;
  layout: Layout | null;
}
