import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useNavigate } from 'react-router';
import { ReactFlowProvider, useReactFlow, useStoreApi, type Connection, type Edge, type EdgeChange, type NodeChange } from '@xyflow/react';
import { componentKinds, componentPinIds, validateDocument, type Component, type ComponentKind, type HarnessDocument, type Problem } from '@shared/harness';
import type { HarnessSummary, RevisionSummary, VersionConflict } from '@shared/api/harness';
import { Button, Caution, ProgressBar, useToast } from '@/components';
import { isApiError, errorMessage } from '@/lib/api';
import { cx } from '@/lib/cx';
import { COMPACT_SCREEN, useMediaQuery } from '@/lib/media';
import { createEditorStore, useEditor, type EditorStore, type Focus } from '../store';
import { useFlowElements } from '../flow';
import { MATE_GAP, componentGeometry, documentGeometry, fillPositions, openingViewport, placedBoxes, splitRef, type Positions } from '@shared/drawing/geometry';
import {
  addComponent,
  addWire,
  componentIds,
  copyFragment,
  newComponent,
  newWire,
  pasteFragment,
  reconnectWire,
  removeClamp,
  removeItems,
  removeState,
  updateComponent,
  updateWire,
  upsertClamp,
  upsertState,
  freeId,
  type Fragment,
} from '../edit';
import { runLayout, warmUpWhenIdle } from '../layoutClient';
import { crashCopies, type CrashCopy } from '../backup';
import { engineReadings, engineWalk, type WalkPath } from '../engineClient';
import { importDocument, saveDocument, savePositions, fetchRevision, usePublish } from '../api/harness';
import { BIG_DRAWING, WORKING_ZOOM, DrawingCanvas } from './DrawingCanvas';
import { BackupDialog } from './BackupDialog';
import { CompactBar, CompactToolbar, SheetHeader, sheetClass, useEscape } from './CompactChrome';
import { ClampForm, ComponentForm, StateForm, WireForm } from './forms';
import type { ComponentFlowNode } from './ComponentNode';
import type { MateFlowEdge } from './MateEdge';
import type { WireFlowEdge } from './WireEdge';
import { Dialog } from './Dialog';
import { RevisionHistory } from './RevisionHistory';
import { WalkPanel, walkHighlight } from './WalkPanel';

const kindLabels: Record<ComponentKind, string> = {
  battery: 'Battery', ground: 'Ground', fuse: 'Fuse', resistor: 'Resistor', load: 'Load', splice: 'Splice',
  connector: 'Connector pair', switch: 'Switch', relay: 'Relay', module: 'Controller',
};

const AUTOSAVE_MS = 1200;
/** The layout worker warms up no sooner than this after a laid-out drawing opens, ... */
const WARM_UP_AFTER_MS = 4000;
/** ... and a run at a time, each once the lead has not moved the pointer, wheel or keys for this long. */
const QUIET_MS = 1500;

type SaveStatus =
  | { kind: 'saved'; at: Date | null }
  | { kind: 'pending' }
  | { kind: 'saving' }
  | { kind: 'invalid'; count: number }
  | { kind: 'conflict'; current: VersionConflict['current'] | null }
  | { kind: 'error'; message: string };

let clipboard: Fragment | null = null;

export interface DrawingEditorProps {
  harness: HarnessSummary;
  revision: RevisionSummary;
  revisions: RevisionSummary[];
  document: HarnessDocument;
  positions: Positions;
}

export function DrawingEditor(props: DrawingEditorProps) {
  return (
    <ReactFlowProvider>
      <EditorInner {...props} />
    </ReactFlowProvider>
  );
}

function EditorInner({ harness, revision, revisions, document: initialDoc, positions: initialPositions }: DrawingEditorProps) {
  const { notify } = useToast();
  const navigate = useNavigate();
  const flow = useReactFlow();
  const flowStore = useStoreApi();
  const store = useMemo<EditorStore>(() => createEditorStore({ doc: initialDoc, positions: initialPositions ?? {} }), []); // eslint-disable-line react-hooks/exhaustive-deps
  const doc = useEditor(store, (s) => s.doc);
  const positions = useEditor(store, (s) => s.positions);
  const selectedNodes = useEditor(store, (s) => s.selectedNodes);
  const selectedEdges = useEditor(store, (s) => s.selectedEdges);
  const focus = useEditor(store, (s) => s.focus);
  const canUndo = useEditor(store, (s) => s.past.length > 0);
  const canRedo = useEditor(store, (s) => s.future.length > 0);

  const [tab, setTab] = useState<'item' | 'states' | 'problems' | 'walk' | 'history'>('item');
  const [layingOut, setLayingOut] = useState<string | null>(null);
  const [voltsState, setVoltsState] = useState('');
  const [volts, setVolts] = useState<Map<string, number | null> | null>(null);
  const [engineNote, setEngineNote] = useState<string | null>(null);
  const [walkPaths, setWalkPaths] = useState<WalkPath[] | null>(null);
  const [walkIndex, setWalkIndex] = useState(0);
  const [publishOpen, setPublishOpen] = useState(false);
  const [status, setStatus] = useState<SaveStatus>({ kind: 'saved', at: null });
  const versionRef = useRef(revision.version);
  const savedChange = useRef(0);
  const savingRef = useRef(false);
  const conflictRef = useRef(false);

  // ---------------------------------------------------------------- crash copy
  // Copies left in this browser by editors (this tab's earlier page, closed or crashed tabs) that closed
  // before the server had everything are offered back; until the lead restores or discards this tab's
  // own, nothing overwrites or removes it. Each tab writes a copy of its own (see backup.ts).
  const [copies] = useState(() => crashCopies(revision.id));
  const [offers, setOffers] = useState<CrashCopy[]>(() => copies.offers({ doc: initialDoc, positions: initialPositions ?? {} }));
  const offersRef = useRef(offers);
  // Other tabs' copies restored here go once this tab's copy or the server holds that change.
  const adopted = useRef<Array<{ key: string; change: number }>>([]);
  const dropAdopted = useCallback((change: number) => {
    for (const a of adopted.current) if (a.change <= change) copies.remove(a.key);
    adopted.current = adopted.current.filter((a) => a.change > change);
  }, [copies]);
  useEffect(() => copies.editing(), [copies]);
  const keepBackup = useCallback(() => {
    if (offersRef.current.some((o) => o.mine)) return;
    const now = store.get();
    if (copies.write({ doc: now.doc, positions: now.positions, at: Date.now(), version: versionRef.current })) dropAdopted(now.change);
  }, [store, copies, dropAdopted]);

  // ---------------------------------------------------------------- layout on open
  const tidy = useCallback(
    async (only?: string[]) => {
      const s = store.get();
      if (s.doc.components.length === 0) return;
      setLayingOut(only ? 'Tidying the selection' : 'Laying out the drawing');
      try {
        const started = performance.now();
        const { positions: laid, ms, warmMs } = await runLayout({ doc: s.doc, only, positions: s.positions });
        // The document was replaced meanwhile (a restored copy, an import): this layout is of another drawing.
        if (store.get().doc !== s.doc) return;
        // For the speed bench: the worker's own time and the round trip.
        performance.measure('ww-drawing-layout', { start: started, end: performance.now(), detail: { workerMs: ms, warmUpMs: warmMs, components: s.doc.components.length } });
        const now = store.get();
        const next = { ...now.positions, ...laid };
        if (!only && now.doc.components.length > BIG_DRAWING) {
          // Working zoom on a full stretch of the drawing, set before the nodes arrive so only those in view are drawn.
          const { width, height } = flowStore.getState();
          const { boxes, home } = placedBoxes(now.doc, next);
          void flow.setViewport(openingViewport(boxes, home, { width: width || 1000, height: height || 700 }, WORKING_ZOOM));
        }
        store.commit({ positions: next });
        if (!only && now.doc.components.length <= BIG_DRAWING) requestAnimationFrame(() => void flow.fitView({ padding: 0.1, maxZoom: 1.2 }));
      } catch (error) {
        notify(`The layout did not finish: ${errorMessage(error)}`, 'bad');
      } finally {
        setLayingOut(null);
      }
    },
    [store, flow, flowStore, notify],
  );

  useEffect(() => {
    const s = store.get();
    const placed = s.doc.components.filter((c) => s.positions[c.id]).length;
    if (s.doc.components.length && placed === 0) {
      const t = setTimeout(() => void tidy(), 0);
      return () => clearTimeout(t);
    } else if (placed < s.doc.components.length) {
      store.moveLive(fillPositions(s.doc, s.positions));
    }
    // Laid out already: the layout worker warms up for a later tidy, once the drawing and its overview
    // picture are done, in short runs while the lead pauses (in one go it takes a core for seconds,
    // which panning on a two-core machine would feel).
    return warmUpWhenIdle(WARM_UP_AFTER_MS, QUIET_MS);
  }, [store, tidy]);

  // ---------------------------------------------------------------- validation
  const [problems, setProblems] = useState<Problem[]>([]);
  useEffect(() => {
    const t = setTimeout(() => {
      const r = validateDocument(doc);
      setProblems(r.ok ? [] : r.problems);
    }, 250);
    return () => clearTimeout(t);
  }, [doc]);
  const problemComponents = useMemo(() => {
    const set = new Set<string>();
    for (const p of problems) {
      const m = /^\$\.components\[(\d+)\]/.exec(p.path);
      if (m && doc.components[Number(m[1])]) set.add(doc.components[Number(m[1])].id);
    }
    return set;
  }, [problems, doc]);

  // ---------------------------------------------------------------- saving
  const save = useCallback(async () => {
    if (savingRef.current || conflictRef.current) return;
    const s = store.get();
    if (s.change === savedChange.current) return;
    const check = validateDocument(s.doc);
    if (!check.ok) {
      setStatus({ kind: 'invalid', count: check.problems.length });
      return;
    }
    savingRef.current = true;
    setStatus({ kind: 'saving' });
    const sentChange = s.change;
    try {
      const result = await saveDocument(revision.id, versionRef.current, s.doc, s.positions);
      versionRef.current = result.version;
      savedChange.current = sentChange;
      // The server has it all: the copy in this browser is no longer needed (unless it is still on offer).
      if (!offersRef.current.some((o) => o.mine) && store.get().change === sentChange) copies.remove();
      dropAdopted(sentChange);
      setStatus(store.get().change === sentChange ? { kind: 'saved', at: new Date() } : { kind: 'pending' });
    } catch (error) {
      if (isApiError(error, 409)) {
        conflictRef.current = true;
        setStatus({ kind: 'conflict', current: null });
        // Who saved it and when: the revision as it stands now.
        fetchRevision(revision.id)
          .then((fresh) => setStatus({ kind: 'conflict', current: { version: fresh.revision.version, updatedBy: fresh.revision.updatedBy, updatedAt: fresh.revision.updatedAt } }))
          .catch(() => undefined);
      } else if (isApiError(error, 422)) {
        setStatus({ kind: 'invalid', count: error.details.length });
      } else setStatus({ kind: 'error', message: errorMessage(error) });
    } finally {
      savingRef.current = false;
    }
  }, [store, revision.id, copies, dropAdopted]);

  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const unsub = store.subscribe(() => {
      const s = store.get();
      if (s.change === savedChange.current || conflictRef.current) return;
      setStatus((st) => (st.kind === 'saving' || st.kind === 'pending' ? st : { kind: 'pending' }));
      clearTimeout(timer);
      timer = setTimeout(() => {
        // A copy in this browser until the server has it (written once per pause, not on every drag frame).
        keepBackup();
        void save().then(() => {
        // Changes made while saving go in the next round.
          if (store.get().change !== savedChange.current && !conflictRef.current) timer = setTimeout(() => void save(), AUTOSAVE_MS);
        });
      }, AUTOSAVE_MS);
    });
    const beforeUnload = (e: BeforeUnloadEvent) => {
      if (store.get().change !== savedChange.current) {
        keepBackup();
        e.preventDefault();
      }
    };
    window.addEventListener('beforeunload', beforeUnload);
    return () => {
      unsub();
      clearTimeout(timer);
      window.removeEventListener('beforeunload', beforeUnload);
    };
  }, [store, save, keepBackup]);

  const reloadTheirs = async () => {
    try {
      const fresh = await fetchRevision(revision.id);
      versionRef.current = fresh.revision.version;
      conflictRef.current = false;
      store.replace({ doc: fresh.document, positions: fillPositions(fresh.document, fresh.positions ?? {}) });
      savedChange.current = store.get().change;
      setStatus({ kind: 'saved', at: new Date() });
      notify('Their version is loaded. Your version is one undo away (Ctrl+Z) if you need anything from it.', 'info');
    } catch (error) {
      notify(errorMessage(error), 'bad');
    }
  };

  const keepMineAsCopy = async () => {
    const s = store.get();
    try {
      const copy = { ...s.doc, name: `${s.doc.name || harness.name} (my copy)` };
      const created = await importDocument(copy, harness.modelId);
      await savePositions(created.revisionId, 1, s.positions).catch(() => undefined);
      if (!offersRef.current.some((o) => o.mine)) copies.remove();
      dropAdopted(s.change);
      notify(`Your version is saved as a new harness: ${copy.name}.`, 'ok');
      conflictRef.current = false;
      savedChange.current = store.get().change;
      navigate(`/harnesses/${created.harnessId}/drawing`);
    } catch (error) {
      notify(`Could not keep your copy: ${errorMessage(error)}. Export it to a file so nothing is lost.`, 'bad');
    }
  };

  const settleOffer = (b: CrashCopy) => {
    offersRef.current = offersRef.current.filter((o) => o.key !== b.key);
    setOffers(offersRef.current);
  };
  const restoreBackup = (b: CrashCopy) => {
    settleOffer(b);
    const placed = b.doc.components.some((c) => b.positions[c.id]);
    store.commit({ doc: b.doc, positions: placed ? fillPositions(b.doc, b.positions) : {} }, { focus: null, selectedNodes: new Set(), selectedEdges: new Set() });
    // This tab's own copy is rewritten by the next autosave; another's is removed once that has happened.
    if (!b.mine) adopted.current.push({ key: b.key, change: store.get().change });
    if (!placed) void tidy();
    notify('Your unsaved copy is back and saving now. Undo (Ctrl+Z) brings back the draft as the server had it.', 'ok');
  };
  const discardBackup = (b: CrashCopy) => {
    settleOffer(b);
    copies.remove(b.key);
    // What is on screen now may itself wait for the server: it gets its own copy.
    if (store.get().change !== savedChange.current) keepBackup();
  };

  // ---------------------------------------------------------------- live engine
  useEffect(() => {
    if (!voltsState) return;
    let stale = false;
    const t = setTimeout(() => {
      if (!validateDocument(doc).ok) {
        setEngineNote('Expected volts wait until the problems listed are fixed.');
        return;
      }
      engineReadings(doc, voltsState)
        .then((r) => {
          if (stale) return;
          setVolts(r.volts);
          setEngineNote(r.unsettled ? 'The relays and controllers did not settle in this state: the volts shown may not hold.' : null);
        })
        .catch((e) => !stale && setEngineNote(errorMessage(e)));
    }, 200);
    return () => {
      stale = true;
      clearTimeout(t);
    };
  }, [doc, voltsState]);

  const hl = useMemo(() => walkHighlight(walkPaths?.[walkIndex] ?? null), [walkPaths, walkIndex]);

  // ---------------------------------------------------------------- xyflow glue
  const awaitingFirstLayout = doc.components.length > 0 && !doc.components.some((c) => positions[c.id]);
  const flowInput = { doc, positions, selectedNodes, selectedEdges, volts: voltsState ? volts : null, highlightPins: hl.pins, highlightWires: hl.wires, problemComponents, focusedClamp: focus?.kind === 'clamp' ? focus.id : null };
  const flowElements = useFlowElements(flowInput);
  // Nothing is drawn before the first layout of an unplaced drawing: every node would sit at 0, 0.
  const nodes = awaitingFirstLayout ? noNodes : flowElements.nodes;
  const edges = awaitingFirstLayout ? noEdges : flowElements.edges;

  const onNodesChange = useCallback(
    (changes: NodeChange<ComponentFlowNode>[]) => {
      const s = store.get();
      let pos: Positions | null = null;
      let sel: Set<string> | null = null;
      for (const ch of changes) {
        if (ch.type === 'position' && ch.position) {
          pos ??= { ...s.positions };
          pos[ch.id] = { x: Math.round(ch.position.x), y: Math.round(ch.position.y) };
        } else if (ch.type === 'select') {
          sel ??= new Set(s.selectedNodes);
          if (ch.selected) sel.add(ch.id);
          else sel.delete(ch.id);
        }
      }
      if (pos) store.moveLive(pos);
      if (sel) {
        const focusNext: Focus | undefined = sel.size === 1 ? { kind: 'component', id: [...sel][0] } : undefined;
        store.select(sel, store.get().selectedEdges, focusNext);
      }
    },
    [store],
  );

  const onEdgesChange = useCallback(
    (changes: EdgeChange<WireFlowEdge | MateFlowEdge>[]) => {
      const s = store.get();
      let sel: Set<string> | null = null;
      for (const ch of changes) {
        if (ch.type === 'select') {
          sel ??= new Set(s.selectedEdges);
          if (ch.selected) sel.add(ch.id);
          else sel.delete(ch.id);
        }
      }
      if (sel) {
        const focusNext: Focus | undefined = sel.size === 1 && s.selectedNodes.size === 0 ? { kind: 'wire', id: [...sel][0] } : undefined;
        store.select(s.selectedNodes, sel, focusNext);
      }
    },
    [store],
  );

  const onConnect = useCallback(
    (c: Connection) => {
      if (!c.sourceHandle || !c.targetHandle) return;
      const from = `${c.source}.${c.sourceHandle}`;
      const to = `${c.target}.${c.targetHandle}`;
      if (from === to) return;
      const s = store.get();
      const w = newWire(s.doc, from, to);
      store.commit({ doc: addWire(s.doc, w) }, { focus: { kind: 'wire', id: w.id }, selectedEdges: new Set([w.id]), selectedNodes: new Set() });
      setTab('item');
    },
    [store],
  );

  const onReconnect = useCallback(
    (old: Edge, c: Connection) => {
      if (!c.sourceHandle || !c.targetHandle) return;
      const s = store.get();
      store.commit({ doc: reconnectWire(s.doc, old.id, `${c.source}.${c.sourceHandle}`, `${c.target}.${c.targetHandle}`) });
    },
    [store],
  );

  const onEdgeClick = useCallback((id: string, event: React.MouseEvent) => {
    // A click on a clamp drawn on the wire picks the clamp.
    const clamp = (event.target as Element | null)?.closest?.('[data-clamp]')?.getAttribute('data-clamp');
    if (clamp) {
      store.setFocus({ kind: 'clamp', id: clamp });
      setTab('item');
    } else if (!id.startsWith('mate:')) {
      store.setFocus({ kind: 'wire', id });
      setTab('item');
    }
  }, [store]);
  const onNodeClick = useCallback((id: string) => {
    store.setFocus({ kind: 'component', id });
    setTab('item');
  }, [store]);

  // ---------------------------------------------------------------- actions
  const addKind = (kind: ComponentKind) => {
    const s = store.get();
    const taken = componentIds(s.doc);
    const vp = flow.getViewport();
    const el = document.querySelector('.ww-drawing');
    const rect = el?.getBoundingClientRect();
    const centre = rect ? flow.screenToFlowPosition({ x: rect.left + rect.width / 2, y: rect.top + rect.height / 2 }) : { x: -vp.x, y: -vp.y };
    const geom = documentGeometry(s.doc);
    const boxes = s.doc.components.map((c) => ({ p: s.positions[c.id], g: geom.get(c.id)! })).filter((b) => b.p);
    // The first place right of the view's centre where the new part overlaps nothing.
    const spot = (w: number, h: number) => {
      let x = Math.round(centre.x - w / 2);
      const y = Math.round(centre.y - h / 2);
      for (let i = 0; i < 200; i++) {
        const hit = boxes.find((b) => x < b.p.x + b.g.width + 40 && x + w + 40 > b.p.x && y < b.p.y + b.g.height + 40 && y + h + 40 > b.p.y);
        if (!hit) break;
        x = hit.p.x + hit.g.width + 60;
      }
      return { x, y };
    };
    let doc2 = s.doc;
    const pos = { ...s.positions };
    if (kind === 'connector') {
      // A pair: half A mates with half B (the pair is declared on A).
      let n = 1;
      while (taken.has(`X${n}A`) || taken.has(`X${n}B`)) n++;
      const aId = `X${n}A`;
      const bId = `X${n}B`;
      const a = { ...newComponent('connector', taken), id: aId, matesWith: bId } as Component;
      const b = { ...newComponent('connector', taken), id: bId } as Component;
      doc2 = addComponent(addComponent(doc2, a), b);
      const at = spot(104 * 2 + MATE_GAP, 140);
      pos[aId] = at;
      pos[bId] = { x: at.x + 104 + MATE_GAP, y: at.y };
      store.commit({ doc: doc2, positions: pos }, { focus: { kind: 'component', id: aId }, selectedNodes: new Set([aId]), selectedEdges: new Set() });
    } else {
      const first = newComponent(kind, taken);
      doc2 = addComponent(doc2, first);
      const g = componentGeometry(first);
      pos[first.id] = spot(g.width, g.height);
      store.commit({ doc: doc2, positions: pos }, { focus: { kind: 'component', id: first.id }, selectedNodes: new Set([first.id]), selectedEdges: new Set() });
    }
    setTab('item');
  };

  const removeSelection = useCallback(() => {
    const s = store.get();
    if (s.selectedNodes.size === 0 && s.selectedEdges.size === 0) return;
    store.commit({ doc: removeItems(s.doc, s.selectedNodes, s.selectedEdges) }, { focus: null, selectedNodes: new Set(), selectedEdges: new Set() });
  }, [store]);

  const copy = useCallback(() => {
    const s = store.get();
    if (s.selectedNodes.size === 0) return;
    clipboard = copyFragment(s.doc, s.positions, s.selectedNodes);
    try {
      localStorage.setItem('wirewalk.drawing.clipboard', JSON.stringify(clipboard));
    } catch {
      /* ignore */
    }
    notify(`Copied ${clipboard.components.length} component${clipboard.components.length === 1 ? '' : 's'} and ${clipboard.wires.length} wire${clipboard.wires.length === 1 ? '' : 's'}.`, 'info');
  }, [store, notify]);

  const paste = useCallback(() => {
    let frag = clipboard;
    if (!frag) {
      try {
        frag = JSON.parse(localStorage.getItem('wirewalk.drawing.clipboard') ?? 'null') as Fragment | null;
      } catch {
        frag = null;
      }
    }
    if (!frag?.components?.length) return;
    const s = store.get();
    const out = pasteFragment(s.doc, s.positions, frag);
    store.commit({ doc: out.doc, positions: out.positions }, { selectedNodes: new Set(out.ids), selectedEdges: new Set(), focus: null });
  }, [store]);

  const tidySelectionOrAll = useCallback(() => {
    const s = store.get();
    void tidy(s.selectedNodes.size > 1 ? [...s.selectedNodes] : undefined);
  }, [store, tidy]);

  // ---------------------------------------------------------------- keyboard
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      const t = e.target as HTMLElement | null;
      if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT' || t.isContentEditable)) return;
      if (document.querySelector('[role="dialog"]')) return;
      const mod = e.ctrlKey || e.metaKey;
      const key = e.key.toLowerCase();
      if (mod && key === 'z' && !e.shiftKey) {
        e.preventDefault();
        store.undo();
      } else if (mod && (key === 'y' || (key === 'z' && e.shiftKey))) {
        e.preventDefault();
        store.redo();
      } else if (mod && key === 'c') {
        copy();
      } else if (mod && key === 'v') {
        e.preventDefault();
        paste();
      } else if (mod && key === 's') {
        e.preventDefault();
        void save();
      } else if (!mod && (e.key === 'Delete' || e.key === 'Backspace')) {
        e.preventDefault();
        removeSelection();
      } else if (!mod && key === 't') {
        tidySelectionOrAll();
      }
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [store, copy, paste, save, removeSelection, tidySelectionOrAll]);

  // ---------------------------------------------------------------- import / export
  const fileInput = useRef<HTMLInputElement>(null);
  const onImportFile = async (file: File) => {
    try {
      const parsed = JSON.parse(await file.text()) as unknown;
      const r = validateDocument(parsed);
      if (!r.ok) {
        notify(`That file is not a harness document: ${r.problems.slice(0, 3).map((p) => `${p.path} ${p.message}`).join('; ')}${r.problems.length > 3 ? ` and ${r.problems.length - 3} more` : ''}.`, 'bad');
        return;
      }
      store.commit({ doc: r.doc, positions: {} }, { focus: null, selectedNodes: new Set(), selectedEdges: new Set() });
      notify(`Imported ${r.doc.components.length} components and ${r.doc.wires.length} wires. Undo (Ctrl+Z) brings the previous drawing back.`, 'ok');
      void tidy();
    } catch (error) {
      notify(`Could not read that file: ${errorMessage(error)}`, 'bad');
    }
  };
  const exportDoc = () => {
    const s = store.get();
    const blob = new Blob([JSON.stringify(s.doc, null, 2)], { type: 'application/json' });
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = `${(s.doc.name || harness.name).replace(/[^A-Za-z0-9_-]+/g, '-').slice(0, 80) || 'harness'}.json`;
    a.click();
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };

  // ---------------------------------------------------------------- publish
  const publish = usePublish(harness.id);
  const doPublish = async (note: string) => {
    await save();
    if (store.get().change !== savedChange.current) {
      notify('Save the draft first: fix the problems listed, then publish.', 'bad');
      return;
    }
    try {
      await publish.mutateAsync({ revisionId: revision.id, note, version: versionRef.current });
      setPublishOpen(false);
      notify('Published. Everyone in the shop now sees this drawing.', 'ok');
      navigate(`/harnesses/${harness.id}/drawing?revision=${revision.id}`, { replace: true });
    } catch (error) {
      notify(errorMessage(error), 'bad');
    }
  };

  // ---------------------------------------------------------------- problems → culprit
  const selectCulprit = (p: Problem) => {
    const m = /^\$\.(components|wires|clamps|states)\[(\d+)\]/.exec(p.path);
    if (!m) return;
    const i = Number(m[2]);
    if (m[1] === 'components' && doc.components[i]) {
      const id = doc.components[i].id;
      store.select([id], [], { kind: 'component', id });
      const pos = positions[id];
      if (pos) void flow.setCenter(pos.x + 40, pos.y + 30, { zoom: Math.max(flow.getZoom(), 0.9), duration: 0 });
    } else if (m[1] === 'wires' && doc.wires[i]) {
      const w = doc.wires[i];
      store.select([], [w.id], { kind: 'wire', id: w.id });
      const a = positions[splitRef(w.from)?.[0] ?? ''];
      if (a) void flow.setCenter(a.x + 40, a.y + 30, { zoom: Math.max(flow.getZoom(), 0.9), duration: 0 });
    } else if (m[1] === 'clamps' && doc.clamps[i]) store.setFocus({ kind: 'clamp', id: doc.clamps[i].id });
    else if (m[1] === 'states' && doc.states[i]) {
      store.setFocus({ kind: 'state', id: doc.states[i].id });
      setTab('states');
      return;
    }
    setTab('item');
  };

  const runWalk = async (from: string, to: string, state?: string) => {
    try {
      const paths = await engineWalk(doc, from, to, state);
      setWalkPaths(paths);
      setWalkIndex(0);
      return paths;
    } catch (error) {
      setWalkPaths(null);
      throw error;
    }
  };

  const pinRefs = useMemo(() => doc.components.flatMap((c) => componentPinIds(c).map((p) => `${c.id}.${p}`)), [doc.components]);

  // ---------------------------------------------------------------- narrow screens
  // The add list and the side panel become sheets over the drawing (one at a time); the side panel
  // opens when something is selected. Wide screens keep the three columns.
  const compact = useMediaQuery(COMPACT_SCREEN);
  const [sheet, setSheet] = useState<'add' | 'panel' | null>(null);
  const addButton = useRef<HTMLButtonElement>(null);
  const panelButton = useRef<HTMLButtonElement>(null);
  const panelSheet = useRef<HTMLElement>(null);
  const addSheet = useRef<HTMLElement>(null);
  /** Closes the sheet; focus goes back to the button that opens it when it was inside (or when asked). */
  const closeSheet = (refocus = false) => {
    const opener = sheet === 'add' ? addButton : panelButton;
    const inside = [panelSheet, addSheet].some((r) => r.current?.contains(document.activeElement));
    setSheet(null);
    if (refocus || inside) opener.current?.focus();
  };
  useEscape(compact && sheet !== null, () => closeSheet(true));
  const openWith = (which: 'add' | 'panel') => {
    setSheet((now) => (now === which ? null : which));
    // Into the sheet that opens, onto its first control (the tab shown, or the first part to add).
    requestAnimationFrame(() => (which === 'add' ? addSheet : panelSheet).current?.querySelector<HTMLElement>('[role="tab"][aria-selected="true"], button')?.focus());
  };
  const lastFocus = useRef(focus);
  useEffect(() => {
    if (compact && focus && focus !== lastFocus.current) setSheet('panel');
    lastFocus.current = focus;
  }, [compact, focus]);
  // What was picked on the drawing stays in sight above the sheet: the view moves up when the sheet would cover it.
  useEffect(() => {
    if (!compact || sheet !== 'panel' || !focus || (focus.kind !== 'component' && focus.kind !== 'pin' && focus.kind !== 'wire')) return;
    const raf = requestAnimationFrame(() => {
      const el = document.querySelector(focus.kind === 'wire' ? `[data-wire="${CSS.escape(focus.id)}"]` : `[data-component="${CSS.escape(focus.id)}"]`);
      const pane = document.querySelector('.ww-drawing')?.getBoundingClientRect();
      const top = panelSheet.current?.getBoundingClientRect().top;
      if (!el || !pane || top === undefined) return;
      const r = el.getBoundingClientRect();
      const mid = r.top + Math.min(r.height, 80) / 2;
      if (mid > pane.top + 8 && mid < top - 16) return;
      const vp = flow.getViewport();
      void flow.setViewport({ ...vp, y: vp.y + (pane.top + top) / 2 - mid });
    });
    return () => cancelAnimationFrame(raf);
  }, [compact, sheet, focus, flow]);
  // The tab shown is scrolled into the sheet's row of tabs (the row is wider than a phone).
  useEffect(() => {
    if (compact && sheet === 'panel') panelSheet.current?.querySelector('[role="tab"][aria-selected="true"]')?.scrollIntoView({ block: 'nearest', inline: 'nearest' });
  }, [compact, sheet, tab]);

  const tidyLabel = selectedNodes.size > 1 ? 'Tidy selection' : 'Tidy all';
  const voltsSelect = (
    <select className="min-h-11 min-w-0 max-w-full rounded-control border border-field bg-surface px-2" value={voltsState} onChange={(e) => setVoltsState(e.target.value)} aria-label="State for expected volts">
      <option value="">no state (volts hidden)</option>
      {doc.states.map((st) => (
        <option key={st.id} value={st.id}>
          {st.label ?? st.id}
        </option>
      ))}
    </select>
  );
  const importInput = (
    <input ref={fileInput} type="file" accept="application/json,.json" className="hidden" aria-label="Import a harness document" onChange={(e) => e.target.files?.[0] && void onImportFile(e.target.files[0])} />
  );
  const tabs = (
    <div role="tablist" className={cx('flex border-line text-sm', compact ? 'overflow-x-auto' : 'flex-wrap border-b')}>
      {(
        [
          ['item', 'Selected'],
          ['states', `States (${doc.states.length})`],
          ['problems', `Problems (${problems.length})`],
          ['walk', 'Walk'],
          ['history', 'Revisions'],
        ] as const
      ).map(([id, label]) => (
        <button
          key={id}
          role="tab"
          aria-selected={tab === id}
          className={cx('min-h-11 px-3 font-medium', compact && 'shrink-0 whitespace-nowrap', tab === id ? 'border-b-4 border-accent text-accent' : 'text-ink-muted')}
          onClick={() => setTab(id)}
        >
          {label}
        </button>
      ))}
    </div>
  );

  return (
    <div className="flex min-h-0 flex-1 flex-col">
      {compact ? (
        <>
          <CompactToolbar
            title={doc.name || harness.name}
            subtitle={`draft, revision ${revision.number}`}
            status={<SaveBadge status={status} onRetry={() => void save()} compact />}
            canUndo={canUndo}
            canRedo={canRedo}
            onUndo={() => store.undo()}
            onRedo={() => store.redo()}
            tools={
              <>
                <Button tone="secondary" className="justify-start" onClick={tidySelectionOrAll}>
                  {tidyLabel}
                </Button>
                <label className="flex flex-col gap-1 text-sm">
                  Expected volts in
                  {voltsSelect}
                </label>
                <div className="grid grid-cols-2 gap-2">
                  <Button onClick={() => fileInput.current?.click()}>Import</Button>
                  <Button onClick={exportDoc}>Export</Button>
                </div>
                <Button tone="primary" onClick={() => setPublishOpen(true)}>
                  Publish…
                </Button>
              </>
            }
          />
          {importInput}
        </>
      ) : (
        <div className="flex flex-wrap items-center gap-2 border-b border-line bg-surface px-3 py-2" role="toolbar" aria-label="Drawing tools">
          <h1 className="mr-2 text-lg font-bold">
            {doc.name || harness.name} <span className="text-sm font-normal text-ink-muted">draft, revision {revision.number}</span>
          </h1>
          <Button tone="quiet" onClick={() => store.undo()} disabled={!canUndo} title="Undo (Ctrl+Z)">
            Undo
          </Button>
          <Button tone="quiet" onClick={() => store.redo()} disabled={!canRedo} title="Redo (Ctrl+Shift+Z)">
            Redo
          </Button>
          <Button tone="quiet" onClick={tidySelectionOrAll} title="Tidy (T): lays out everything, or only the selection when several are selected">
            {tidyLabel}
          </Button>
          <label className="flex min-w-0 max-w-full items-center gap-2 text-sm">
            Expected volts in
            {voltsSelect}
          </label>
          <span className="grow" />
          <SaveBadge status={status} onRetry={() => void save()} />
          <Button tone="quiet" onClick={() => fileInput.current?.click()}>
            Import
          </Button>
          {importInput}
          <Button tone="quiet" onClick={exportDoc}>
            Export
          </Button>
          <Button tone="primary" onClick={() => setPublishOpen(true)}>
            Publish…
          </Button>
        </div>
      )}
      {/* Narrow windows put the add list and the side panel in sheets over the drawing; wide ones put the three side by side. */}
      <div className={cx('flex min-h-0 flex-1 flex-col lg:flex-row', compact && 'relative')}>
        {compact ? (
          <nav ref={addSheet} id="ww-add-sheet" aria-label="Add a component" className={sheetClass} hidden={sheet !== 'add'}>
            <SheetHeader onClose={() => closeSheet(true)} closeLabel="Close the add list">
              <h2 className="px-3 font-bold">Add a component</h2>
            </SheetHeader>
            <div className="grid grid-cols-3 gap-2 overflow-y-auto p-3">
              {componentKinds.map((k) => (
                <Button key={k} tone="secondary" className="px-2 text-sm" onClick={() => addKind(k)}>
                  {kindLabels[k]}
                </Button>
              ))}
            </div>
            <p className="px-3 pb-3 text-sm text-ink-muted">It goes in the middle of the view. Drag from a pin to another pin to draw a wire.</p>
          </nav>
        ) : (
          <nav aria-label="Add a component" className="flex shrink-0 items-center gap-1 overflow-x-auto border-b border-line bg-surface p-2 lg:w-32 lg:flex-col lg:items-stretch lg:overflow-y-auto lg:border-r lg:border-b-0">
            <p className="px-1 text-sm font-bold text-ink-muted">Add</p>
            {componentKinds.map((k) => (
              <Button key={k} tone="secondary" className="shrink-0 justify-start px-2 text-sm" onClick={() => addKind(k)}>
                {kindLabels[k]}
              </Button>
            ))}
            <p className="mt-2 hidden px-1 text-xs text-ink-muted lg:block">Drag from a pin to another pin to draw a wire.</p>
          </nav>
        )}
        <div className={cx('relative min-w-0', compact ? 'min-h-0 flex-1' : 'min-h-48 flex-[3]')}>
          {layingOut ? (
            <div className="absolute inset-x-0 top-0 z-10 bg-surface/90 px-4 py-2">
              <ProgressBar label={layingOut} />
            </div>
          ) : null}
          {doc.components.length === 0 ? (
            <p className={cx('pointer-events-none absolute inset-x-0 top-1/3 z-10 text-center text-ink-muted', compact && 'px-3')}>
              An empty drawing. Add a battery, a fuse, a connector pair and a load {compact ? 'with Add below' : 'from the list on the left'}, then drag from pin to pin to wire them.
            </p>
          ) : null}
          <DrawingCanvas
            nodes={nodes}
            edges={edges}
            onNodesChange={onNodesChange}
            onEdgesChange={onEdgesChange}
            onConnect={onConnect}
            onReconnect={onReconnect}
            onNodeDragStart={() => store.beginDrag()}
            onNodeDragStop={() => store.endDrag()}
            onNodeClick={onNodeClick}
            onEdgeClick={onEdgeClick}
            onPaneClick={() => {
              store.select([], [], null);
              // A tap on the empty drawing puts the sheet away.
              if (compact) closeSheet();
            }}
            label={`Drawing of ${doc.name}`}
            componentCount={doc.components.length}
            overview={flowInput}
            layingOut={!!layingOut}
          />
        </div>
        <aside
          ref={panelSheet}
          id="ww-side-panel"
          className={compact ? sheetClass : 'flex min-h-0 flex-[2] flex-col border-t border-line bg-surface lg:w-[22rem] lg:flex-none lg:border-t-0 lg:border-l'}
          hidden={compact && sheet !== 'panel'}
          aria-label="Side panel"
        >
          {compact ? (
            <SheetHeader onClose={() => closeSheet(true)} closeLabel="Close the panel">
              {tabs}
            </SheetHeader>
          ) : (
            tabs
          )}
          <div className="min-h-0 flex-1 overflow-y-auto p-3">
            {engineNote && voltsState ? <p className="mb-2 text-sm text-caution">{engineNote}</p> : null}
            {tab === 'item' && focus ? (
              <button className="mb-2 text-sm text-accent underline" onClick={() => store.select([], [], null)}>
                ← Clear the selection (list every wire)
              </button>
            ) : null}
            {tab === 'item' ? <ItemPanel store={store} focus={focus} doc={doc} onTab={setTab} /> : null}
            {tab === 'states' ? <StatesPanel store={store} doc={doc} focus={focus} /> : null}
            {tab === 'problems' ? <ProblemsPanel problems={problems} onPick={selectCulprit} /> : null}
            {tab === 'walk' ? (
              <WalkPanel doc={doc} pinRefs={pinRefs} paths={walkPaths} index={walkIndex} onIndex={setWalkIndex} onWalk={runWalk} onClear={() => setWalkPaths(null)} />
            ) : null}
            {tab === 'history' ? <RevisionHistory harnessId={harness.id} revisions={revisions} currentId={revision.id} /> : null}
          </div>
        </aside>
      </div>
      {compact ? (
        <CompactBar sheet={sheet} onAdd={() => openWith('add')} onPanel={() => openWith('panel')} addRef={addButton} panelRef={panelButton} panelControls="ww-side-panel" problems={problems.length} />
      ) : null}
      {offers.length ? <BackupDialog copies={offers} current={doc} version={revision.version} onRestore={restoreBackup} onDiscard={discardBackup} /> : null}
      <ConflictDialog status={status} onReload={() => void reloadTheirs()} onKeepMine={() => void keepMineAsCopy()} />
      <PublishDialog open={publishOpen} busy={publish.isPending} problems={problems.length} onCancel={() => setPublishOpen(false)} onPublish={(note) => void doPublish(note)} />
    </div>
  );
}

const noNodes: ComponentFlowNode[] = [];
const noEdges: Array<WireFlowEdge | MateFlowEdge> = [];

/** The save state; `compact` (the phone's toolbar) says it in a few words, the whole sentence in its title. */
function SaveBadge({ status, onRetry, compact = false }: { status: SaveStatus; onRetry: () => void; compact?: boolean }) {
  const text = (() => {
    switch (status.kind) {
      case 'saved': return status.at ? `Saved ${status.at.toLocaleTimeString([], { hour: '2-digit', minute: '2-digit', second: '2-digit' })}` : 'All changes saved';
      case 'pending': return 'Unsaved changes…';
      case 'saving': return 'Saving…';
      case 'invalid': return `Not saved: ${status.count} problem${status.count === 1 ? '' : 's'} to fix`;
      case 'conflict': return 'Not saved: someone else changed this draft';
      case 'error': return `Not saved: ${status.message}`;
    }
  })();
  const short = (() => {
    switch (status.kind) {
      case 'saved': return 'Saved';
      case 'pending': return 'Unsaved…';
      case 'saving': return 'Saving…';
      case 'invalid': return `Not saved: ${status.count} problem${status.count === 1 ? '' : 's'}`;
      default: return 'Not saved';
    }
  })();
  const bad = status.kind === 'invalid' || status.kind === 'conflict' || status.kind === 'error';
  return (
    <span
      role="status"
      aria-live="polite"
      data-save={status.kind}
      title={compact ? text : undefined}
      className={cx('flex items-center', compact ? 'min-w-0 gap-1 text-xs' : 'gap-2 text-sm', bad ? 'font-bold text-bad' : 'text-ink-muted')}
    >
      {bad ? <span aria-hidden="true">✗</span> : status.kind === 'saved' ? <span aria-hidden="true">✓</span> : null}
      {compact ? (
        <>
          <span aria-hidden="true" className="truncate">{short}</span>
          <span className="sr-only">{text}</span>
        </>
      ) : (
        text
      )}
      {status.kind === 'error' ? (
        <Button tone="quiet" className={compact ? 'min-h-8 px-2 text-xs' : undefined} onClick={onRetry}>
          Try again
        </Button>
      ) : null}
    </span>
  );
}

function ConflictDialog({ status, onReload, onKeepMine }: { status: SaveStatus; onReload: () => void; onKeepMine: () => void }) {
  if (status.kind !== 'conflict') return null;
  const who = status.current?.updatedBy?.name ?? 'Someone else';
  const when = status.current?.updatedAt ? new Date(status.current.updatedAt).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' }) : null;
  return (
    <Dialog title="This draft was changed by someone else" onClose={() => undefined}>
      <p>
        {who} saved this draft{when ? ` at ${when}` : ''} while you were editing it. Your changes are not saved yet and nothing is lost.
      </p>
      <p className="mt-2">Reload theirs (your version stays one undo away in this window), or keep yours as a copy: a new harness with your drawing.</p>
      <div className="mt-4 flex flex-wrap gap-2">
        <Button tone="primary" onClick={onReload}>
          Reload theirs
        </Button>
        <Button onClick={onKeepMine}>Keep mine as a copy</Button>
      </div>
    </Dialog>
  );
}

function PublishDialog({ open, busy, problems, onCancel, onPublish }: { open: boolean; busy: boolean; problems: number; onCancel: () => void; onPublish: (note: string) => void }) {
  const [note, setNote] = useState('');
  if (!open) return null;
  return (
    <Dialog title="Publish this drawing" onClose={onCancel}>
      <p>Everyone in the shop will see this revision; it cannot be changed after. Later changes go in a new draft.</p>
      <Caution id="expectations" className="mt-3" />
      <label className="mt-3 block font-medium" htmlFor="publish-note">
        What changed (for the revision history)
      </label>
      <textarea id="publish-note" className="mt-1 block w-full rounded-control border border-field bg-surface p-2" rows={3} value={note} onChange={(e) => setNote(e.target.value)} />
      {problems ? <p className="mt-2 font-bold text-bad">✗ Fix the {problems} problem{problems === 1 ? '' : 's'} listed before publishing.</p> : null}
      <div className="mt-4 flex flex-wrap gap-2">
        <Button tone="primary" busy={busy} disabled={problems > 0} onClick={() => onPublish(note)}>
          Publish
        </Button>
        <Button onClick={onCancel}>Cancel</Button>
      </div>
    </Dialog>
  );
}

function ProblemsPanel({ problems, onPick }: { problems: Problem[]; onPick: (p: Problem) => void }) {
  if (problems.length === 0) return <p className="text-ok">✓ The validator finds no problems in this drawing.</p>;
  return (
    <ul className="flex flex-col gap-1" aria-label="Problems">
      {problems.map((p, i) => (
        <li key={`${p.path}-${i}`}>
          <button className="w-full rounded-control px-2 py-1 text-left hover:bg-sunken" onClick={() => onPick(p)}>
            <span className="font-mono text-xs text-ink-muted">{p.path}</span>
            <span className="block text-bad">✗ {p.message}</span>
          </button>
        </li>
      ))}
    </ul>
  );
}

function ItemPanel({ store, focus, doc, onTab }: { store: EditorStore; focus: Focus; doc: HarnessDocument; onTab: (t: 'states') => void }) {
  const [newClamp, setNewClamp] = useState(false);
  const selectedEdges = useEditor(store, (s) => s.selectedEdges);
  if (focus?.kind === 'component' || focus?.kind === 'pin') {
    const c = doc.components.find((x) => x.id === focus.id);
    if (c) {
      return (
        <ComponentForm
          key={c.id}
          component={c}
          doc={doc}
          onApply={(next) => {
            const s = store.get();
            const pos = next.id !== c.id && s.positions[c.id] ? { ...s.positions, [next.id]: s.positions[c.id] } : s.positions;
            store.commit({ doc: updateComponent(s.doc, c.id, next), positions: pos }, { focus: { kind: 'component', id: next.id }, selectedNodes: new Set([next.id]) });
          }}
          onRemove={() => store.commit({ doc: removeItems(store.get().doc, [c.id]) }, { focus: null })}
        />
      );
    }
  }
  if (focus?.kind === 'wire') {
    const w = doc.wires.find((x) => x.id === focus.id);
    if (w) {
      const clamps = doc.clamps.filter((cl) => cl.wires.includes(w.id));
      return (
        <div className="flex flex-col gap-4">
          <WireForm
            key={w.id}
            wire={w}
            doc={doc}
            onApply={(next) => store.commit({ doc: updateWire(store.get().doc, w.id, next) }, { focus: { kind: 'wire', id: next.id }, selectedEdges: new Set([next.id]) })}
            onRemove={() => store.commit({ doc: removeItems(store.get().doc, [], [w.id]) }, { focus: null })}
          />
          <div>
            <p className="font-medium">Clamps on this wire</p>
            {clamps.length ? (
              <ul>
                {clamps.map((cl) => (
                  <li key={cl.id}>
                    <button className="text-accent underline" onClick={() => store.setFocus({ kind: 'clamp', id: cl.id })}>
                      {cl.id}
                      {cl.label ? `: ${cl.label}` : ''}
                    </button>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink-muted">None.</p>
            )}
            {newClamp ? (
              <ClampForm
                clamp={{ id: freeId('CL', new Set(doc.clamps.map((x) => x.id))), wires: selectedEdges.size ? [...selectedEdges] : [w.id] }}
                doc={doc}
                isNew
                onApply={(next) => {
                  store.commit({ doc: upsertClamp(store.get().doc, null, next) }, { focus: { kind: 'clamp', id: next.id } });
                  setNewClamp(false);
                }}
              />
            ) : (
              <Button className="mt-2" onClick={() => setNewClamp(true)}>
                Add a clamp here
              </Button>
            )}
          </div>
        </div>
      );
    }
  }
  if (focus?.kind === 'clamp') {
    const cl = doc.clamps.find((x) => x.id === focus.id);
    if (cl) {
      return (
        <ClampForm
          key={cl.id}
          clamp={cl}
          doc={doc}
          isNew={false}
          onApply={(next) => store.commit({ doc: upsertClamp(store.get().doc, cl.id, next) }, { focus: { kind: 'clamp', id: next.id } })}
          onRemove={() => store.commit({ doc: removeClamp(store.get().doc, cl.id) }, { focus: null })}
        />
      );
    }
  }
  if (focus?.kind === 'state') {
    onTab('states');
  }
  return (
    <div className="flex flex-col gap-3 text-sm">
      <p>Select a component or a wire on the drawing to edit it here.</p>
      <ul className="list-disc pl-5 text-ink-muted">
        <li>Drag from one pin to another to draw a wire; drag a wire's end to move it.</li>
        <li>Shift-drag to select several; Ctrl-click to add to the selection.</li>
        <li>Delete removes, Ctrl+Z undoes, Ctrl+Shift+Z redoes, Ctrl+C / Ctrl+V copy and paste, T tidies, Ctrl+S saves now.</li>
      </ul>
      {doc.wires.length ? (
        <div>
          <p className="font-medium text-ink">Wires</p>
          <ul aria-label="Wires" className="flex flex-col">
            {doc.wires.slice(0, 150).map((w) => (
              <li key={w.id}>
                <button className="min-h-8 text-left text-accent underline" onClick={() => store.select([], [w.id], { kind: 'wire', id: w.id })}>
                  {w.id}: {w.from} → {w.to}
                </button>
              </li>
            ))}
          </ul>
          {doc.wires.length > 150 ? <p className="text-ink-muted">and {doc.wires.length - 150} more: pick them on the drawing.</p> : null}
        </div>
      ) : null}
      {doc.clamps.length ? (
        <div>
          <p className="font-medium text-ink">Clamps</p>
          <ul>
            {doc.clamps.map((cl) => (
              <li key={cl.id}>
                <button className="text-accent underline" onClick={() => store.setFocus({ kind: 'clamp', id: cl.id })}>
                  {cl.id}
                  {cl.label ? `: ${cl.label}` : ''} ({cl.wires.join(', ')})
                </button>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}

function StatesPanel({ store, doc, focus }: { store: EditorStore; doc: HarnessDocument; focus: Focus }) {
  const [editing, setEditing] = useState<string | null>(focus?.kind === 'state' ? focus.id : null);
  const [adding, setAdding] = useState(false);
  const current = doc.states.find((s) => s.id === editing);
  const suggest = () => {
    const taken = new Set(doc.states.map((s) => s.id));
    for (const [id, label] of [['key_off', 'Key off'], ['key_on', 'Key on'], ['running', 'Running']] as const) if (!taken.has(id)) return { id, label };
    return { id: freeId('state_', taken), label: '' };
  };
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-muted">A state says how the machine stands (key off, key on, running): switch positions, battery volts, controller outputs, unplugged halves.</p>
      <ul className="flex flex-col gap-1">
        {doc.states.map((s) => (
          <li key={s.id}>
            <button className={cx('w-full rounded-control px-2 py-1 text-left hover:bg-sunken', editing === s.id && 'bg-accent-soft')} onClick={() => { setEditing(s.id); setAdding(false); }}>
              <strong>{s.label ?? s.id}</strong> <span className="text-sm text-ink-muted">{s.id}</span>
            </button>
          </li>
        ))}
      </ul>
      {current && !adding ? (
        <StateForm
          key={current.id}
          state={current}
          doc={doc}
          isNew={false}
          onApply={(next) => {
            store.commit({ doc: upsertState(store.get().doc, current.id, next) });
            setEditing(next.id);
          }}
          onRemove={() => {
            store.commit({ doc: removeState(store.get().doc, current.id) });
            setEditing(null);
          }}
        />
      ) : null}
      {adding ? (
        <StateForm
          state={{ ...suggest(), switches: {} }}
          doc={doc}
          isNew
          onApply={(next) => {
            store.commit({ doc: upsertState(store.get().doc, null, next) });
            setAdding(false);
            setEditing(next.id);
          }}
        />
      ) : (
        <Button onClick={() => { setAdding(true); setEditing(null); }}>Add a state</Button>
      )}
    </div>
  );
}
