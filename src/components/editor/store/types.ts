/**
 * The editor store's shape: one zustand store per island, made of four slices (diagram,
 * selection, history, settings). Only `layout` and `findings` are tracked by undo; selection,
 * saving state and the unit choice are not part of the drawing's history.
 */
import type { StateCreator, StoreApi } from 'zustand';
import type { TemporalState } from 'zundo';
import type { CatalogIndex } from '~/lib/domain/catalog';
import type { CatalogPart, Finding, Layout, MachineFamily, Place } from '~/lib/domain/schemas';
import type { UnitSystem } from '~/lib/domain/units';
import type { EditorApi, SavedVersion } from './api';

/** Parts on the shelf: the machine owner's own, and the dealer's. */
export interface StockCount {
  own: number;
  dealer: number;
}

/** What the page hands the island (serialisable: it travels as island props). */
export interface EditorInit {
  family: MachineFamily;
  catalog: CatalogPart[];
  layout: Layout;
  layoutId: string;
  layoutName: string;
  machineId: string;
  machineName: string;
  /** The version the editor starts from; a save names it so a newer one is a conflict. */
  baseVersion: number;
  units: UnitSystem;
  canEdit: boolean;
  stock: Record<string, StockCount>;
}

export interface Announcement {
  text: string;
  /** Increments so the same words twice are still announced. */
  seq: number;
}

/** `focus`: keyboard focus follows the selection to the edited place (in the same set()). */
export interface EditOptions {
  focus?: boolean;
}

export interface DiagramSlice {
  family: MachineFamily;
  catalog: CatalogIndex;
  layout: Layout;
  findings: Finding[];
  announcement: Announcement;
  /** Put a catalog part at a place (replacing what was there). False when the part does not go there. */
  placePart: (partNumber: string, place: Place, opts?: EditOptions) => boolean;
  /** Move what is at `from` to `to`; when `to` holds a part of the same kind, the two swap. */
  movePart: (from: Place, to: Place, opts?: EditOptions) => boolean;
  removePart: (place: Place) => boolean;
  /** Replace the whole layout (reload a newer version) as one undoable step. */
  replaceLayout: (layout: Layout, why: string) => void;
  announce: (text: string) => void;
}

export interface SelectionSlice {
  selectedPlace: Place | null;
  /** Index into `findings` of the finding the user chose, or null. */
  activeFinding: number | null;
  /** Places of the chosen finding, highlighted in the drawing. */
  highlightPlaces: Place[];
  /** Bumped whenever the selection should take keyboard focus (the diagram focuses it). */
  focusSeq: number;
  select: (place: Place | null, opts?: { focus?: boolean }) => void;
  chooseFinding: (index: number | null) => void;
}

export type SaveState = 'idle' | 'saving' | 'saved' | 'error' | 'conflict';

export interface Conflict {
  current: SavedVersion;
  /** The body the user tried to save, kept until they choose. */
  mine: Layout;
}

export interface HistorySlice {
  layoutId: string;
  layoutName: string;
  machineId: string;
  machineName: string;
  canEdit: boolean;
  baseVersion: number;
  /** The layout as last saved or loaded: the editor is dirty when `layout` is another object. */
  savedLayout: Layout;
  saveState: SaveState;
  saveError: string | null;
  conflict: Conflict | null;
  /** The note to store with the next saved version. */
  draftNote: string;
  setDraftNote: (note: string) => void;
  undo: () => void;
  redo: () => void;
  /** Save a new version with the draft note. */
  save: () => Promise<SaveState>;
  /** Take the newer version from a conflict; the user's edits stay one Undo away. */
  reloadNewer: () => void;
  /** Save the user's edits as a new layout on the same machine; resolves to its id. */
  saveAsCopy: (name: string, note?: string) => Promise<string | null>;
  dismissConflict: () => void;
}

export type LayoutSettingField = 'crop' | 'drum' | 'rotorRpm' | 'clearanceMm' | 'vaneControl' | 'vaneSetting';

export interface SettingsSlice {
  units: UnitSystem;
  stock: Record<string, StockCount>;
  setUnits: (units: UnitSystem) => void;
  /** Change one of the layout's settings (undoable; findings re-checked). */
  setSetting: <F extends LayoutSettingField>(field: F, value: Layout[F]) => void;
}

export type EditorState = DiagramSlice & SelectionSlice & HistorySlice & SettingsSlice;

/** What undo tracks. */
export type Tracked = Pick<EditorState, 'layout' | 'findings'>;

export type EditorStoreApi = StoreApi<EditorState> & { temporal: StoreApi<TemporalState<Tracked>> };

/** zundo declares its mutator as ['temporal', unknown]; the history slice narrows it. */
export type EditorSliceCreator<T> = StateCreator<EditorState, [['temporal', unknown]], [], T>;

/** Services a slice needs from outside: the network (and nothing else). */
export interface EditorDeps {
  api: EditorApi;
}
