/** The editor's calls to the API: save a version, save as a new layout, store the unit choice. */
import type { Layout } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import type { Json, VersionView } from '~/lib/responses';
import { ApiError, sendJson } from '~/components/shared/api';

/**
 * A version as the editor holds it: the 409 of a save carries a whole `VersionView`; the 201
 * answers the stored row, which names no author, so who saved it is optional here.
 */
export type SavedVersion = Json<Omit<VersionView, 'createdBy' | 'createdByName'>> &
  Partial<Json<Pick<VersionView, 'createdBy' | 'createdByName'>>>;

export type SaveResult = { ok: true; version: SavedVersion } | { ok: false; conflict: SavedVersion } | { ok: false; error: string };

export interface EditorApi {
  saveVersion(layoutId: string, body: { baseVersion: number; body: Layout; note: string }): Promise<SaveResult>;
  createLayout(
    machineId: string,
    body: { name: string; body: Layout; note: string },
  ): Promise<{ ok: true; layoutId: string } | { ok: false; error: string }>;
  saveUnits(units: UnitSystem): Promise<boolean>;
}

const OFFLINE = 'Could not reach the server. Your changes are still here; try again.';

/** The message of a refusal, or the words for a server out of reach. */
const failure = (err: unknown): string => (err instanceof ApiError ? err.message : OFFLINE);

/** The real API over fetch (same origin, session cookie), through the islands' typed helpers. */
export const fetchApi: EditorApi = {
  async saveVersion(layoutId, body) {
    try {
      const { version } = await sendJson<{ version: SavedVersion }>('PUT', `/api/layouts/${layoutId}`, body);
      return { ok: true, version };
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && isVersion(err.detail.current))
        return { ok: false, conflict: err.detail.current };
      return { ok: false, error: failure(err) };
    }
  },
  async createLayout(machineId, body) {
    try {
      const { layout } = await sendJson<{ layout: { id: string } }>('POST', `/api/machines/${machineId}/layouts`, body);
      return { ok: true, layoutId: layout.id };
    } catch (err) {
      return { ok: false, error: failure(err) };
    }
  },
  async saveUnits(units) {
    try {
      await sendJson('PUT', '/api/me', { unitSystem: units });
      return true;
    } catch {
      return false;
    }
  },
};

/** A 409's `current`: the version someone else saved. */
function isVersion(v: unknown): v is SavedVersion {
  return (
    typeof v === 'object' &&
    v !== null &&
    typeof (v as { version?: unknown }).version === 'number' &&
    typeof (v as { body?: unknown }).body === 'object'
  );
}
