import { useEffect, useId, useRef } from 'react';
import type { HarnessDocument } from '@shared/harness';
import { Button } from '@/components';
import { backupDifference, type CrashCopy } from '../backup';
import { Dialog } from './Dialog';

const whenText = (ms: number) => {
  const at = new Date(ms);
  return `${at.toLocaleDateString([], { day: 'numeric', month: 'short' })} at ${at.toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })}`;
};

const whose = (c: CrashCopy) => (c.mine ? 'Left in this tab' : c.tab ? 'Left by another tab or window' : 'Left in this browser');

/** The crash copies found on open, newest first: each is restored or discarded on its own. */
export function BackupDialog({ copies, current, version, onRestore, onDiscard }: {
  copies: CrashCopy[];
  current: HarnessDocument;
  version: number;
  onRestore: (c: CrashCopy) => void;
  onDiscard: (c: CrashCopy) => void;
}) {
  const ref = useRef<HTMLDivElement>(null);
  // The buttons pressed go with their copy: focus moves on to the next copy's.
  useEffect(() => {
    if (!ref.current?.contains(document.activeElement)) ref.current?.querySelector<HTMLElement>('button')?.focus();
  }, [copies.length]);
  return (
    <Dialog title="Unsaved work from this browser" onClose={() => undefined}>
      <div ref={ref}>
        <p>
          {copies.length === 1
            ? 'This browser kept a copy of the draft that the server never got.'
            : `This browser kept ${copies.length} copies of the draft that the server never got, from different tabs or windows. The newest is first.`}
        </p>
        <ul aria-label="Copies kept in this browser" className="mt-3 flex max-h-[60dvh] flex-col gap-3 overflow-y-auto">
          {copies.map((c, i) => (
            <CopyItem key={c.key} copy={c} newest={i === 0} current={current} version={version} onRestore={onRestore} onDiscard={onDiscard} />
          ))}
        </ul>
        <p className="mt-3 text-sm text-ink-muted">
          Restore one to go on where you left off, or discard it and keep the draft as saved.
          {copies.length > 1 ? ' Restoring another after that puts it in place of the first; Undo (Ctrl+Z) brings that back.' : ''}
        </p>
      </div>
    </Dialog>
  );
}

function CopyItem({ copy: c, newest, current, version, onRestore, onDiscard }: { copy: CrashCopy; newest: boolean; current: HarnessDocument; version: number; onRestore: (c: CrashCopy) => void; onDiscard: (c: CrashCopy) => void }) {
  const id = useId();
  const savedSince = c.version !== undefined && c.version !== version;
  return (
    <li aria-labelledby={id} className="rounded-control border border-line p-3">
      <h3 id={id} className="font-bold">
        {whose(c)}, {whenText(c.at)}
      </h3>
      <p className="mt-1">
        {c.doc.components.length} components, {c.doc.wires.length} wires. Against the draft as saved: {backupDifference(c, current)}.
      </p>
      {savedSince ? (
        <p className="mt-2 font-bold text-caution">The draft was saved again after this copy was made. Restoring puts the copy in its place; Undo (Ctrl+Z) brings the saved one back.</p>
      ) : null}
      <div className="mt-3 flex flex-wrap gap-2">
        <Button tone={newest ? 'primary' : 'secondary'} onClick={() => onRestore(c)}>
          Restore this copy
        </Button>
        <Button onClick={() => onDiscard(c)}>Discard it</Button>
      </div>
    </li>
  );
}
