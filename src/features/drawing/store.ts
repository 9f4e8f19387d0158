/**
 * The editor's state: the document and the positions, with undo/redo over
 * both (kept across saves for the whole session), the selection and what the
 * side panel shows. A tiny external store, read with useEditor(selector).
 */
import { useSyncExternalStore } from 'react';
import type { HarnessDocument } from '@shared/harness';
import type { Positions } from '@shared/drawing/geometry';
import { prunePositions } from './edit';

export type Focus =
  | { kind: 'component'; id: string }
  | { kind: 'pin'; id: string; pin: string }
  | { kind: 'wire'; id: string }
  | { kind: 'clamp'; id: string }
  | { kind: 'state'; id: string }
  | { kind: 'document' }
  | null;

export interface Snapshot {
  doc: HarnessDocument;
  positions: Positions;
}

export interface EditorState extends Snapshot {
  past: Snapshot[];
  future: Snapshot[];
  selectedNodes: ReadonlySet<string>;
  selectedEdges: ReadonlySet<string>;
  focus: Focus;
  /** +1 on every change of document or positions (saving compares it). */
  change: number;
}

const HISTORY = 300;

export interface EditorStore {
  get(): EditorState;
  subscribe(listener: () => void): () => void;
  /** A change that can be undone. */
  commit(next: Partial<Snapshot>, extra?: Partial<Pick<EditorState, 'focus' | 'selectedNodes' | 'selectedEdges'>>): void;
  /** A change of positions while dragging: not its own undo step (see beginDrag/endDrag). */
  moveLive(positions: Positions): void;
  beginDrag(): void;
  endDrag(): void;
  select(nodes: Iterable<string>, edges: Iterable<string>, focus?: Focus): void;
  setFocus(focus: Focus): void;
  undo(): void;
  redo(): void;
  /** Replaces everything (a reload from the server): history kept, so the replaced work can be undone back. */
  replace(snapshot: Snapshot): void;
}

export function createEditorStore(initial: Snapshot): EditorStore {
  let state: EditorState = {
    ...initial,
    past: [],
    future: [],
    selectedNodes: new Set(),
    selectedEdges: new Set(),
    focus: null,
    change: 0,
  };
  let dragOrigin: Snapshot | null = null;
  const listeners = new Set<() => void>();
  const emit = () => {
    for (const l of listeners) l();
  };
  const set = (next: EditorState) => {
    state = next;
    emit();
  };
  const snap = (): Snapshot => ({ doc: state.doc, positions: state.positions });
  const push = (past: Snapshot[], s: Snapshot) => (past.length >= HISTORY ? [...past.slice(1), s] : [...past, s]);
  const cleanSelection = (doc: HarnessDocument, nodes: ReadonlySet<string>, edges: ReadonlySet<string>) => {
    const ids = new Set(doc.components.map((c) => c.id));
    const wires = new Set(doc.wires.map((w) => w.id));
    return { selectedNodes: new Set([...nodes].filter((n) => ids.has(n))), selectedEdges: new Set([...edges].filter((e) => wires.has(e))) };
  };

  return {
    get: () => state,
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    commit(next, extra) {
      const doc = next.doc ?? state.doc;
      const positions = prunePositions(doc, next.positions ?? state.positions);
      const sel = cleanSelection(doc, extra?.selectedNodes ?? state.selectedNodes, extra?.selectedEdges ?? state.selectedEdges);
      set({ ...state, ...extra, ...sel, doc, positions, past: push(state.past, snap()), future: [], change: state.change + 1 });
    },
    moveLive(positions) {
      set({ ...state, positions, change: state.change + 1 });
    },
    beginDrag() {
      dragOrigin = snap();
    },
    endDrag() {
      if (dragOrigin && dragOrigin.positions !== state.positions) set({ ...state, past: push(state.past, dragOrigin), future: [] });
      dragOrigin = null;
    },
    select(nodes, edges, focus) {
      set({ ...state, selectedNodes: new Set(nodes), selectedEdges: new Set(edges), focus: focus === undefined ? state.focus : focus });
    },
    setFocus(focus) {
      set({ ...state, focus });
    },
    undo() {
      const prev = state.past[state.past.length - 1];
      if (!prev) return;
      const sel = cleanSelection(prev.doc, state.selectedNodes, state.selectedEdges);
      set({ ...state, ...prev, ...sel, past: state.past.slice(0, -1), future: [snap(), ...state.future], change: state.change + 1 });
    },
    redo() {
      const next = state.future[0];
      if (!next) return;
      const sel = cleanSelection(next.doc, state.selectedNodes, state.selectedEdges);
      set({ ...state, ...next, ...sel, past: push(state.past, snap()), future: state.future.slice(1), change: state.change + 1 });
    },
    replace(snapshot) {
      set({ ...state, ...snapshot, past: push(state.past, snap()), future: [], selectedNodes: new Set(), selectedEdges: new Set(), focus: null, change: state.change + 1 });
    },
  };
}

export function useEditor<T>(store: EditorStore, selector: (s: EditorState) => T): T {
  return useSyncExternalStore(store.subscribe, () => selector(store.get()), () => selector(store.get()));
}
