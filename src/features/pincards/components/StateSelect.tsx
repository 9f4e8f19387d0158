import { stateLabel, type Doc } from '../model';

/** A drop-down of the harness's machine states, in their own words. */
export function StateSelect({ doc, value, onChange, className }: { doc: Doc; value: string; onChange: (state: string) => void; className?: string }) {
  return (
    <select className={className} value={value} onChange={(e) => onChange(e.target.value)}>
      {doc.states.map((s) => (
        <option key={s.id} value={s.id}>
          {stateLabel(doc, s.id)}
        </option>
      ))}
    </select>
  );
}
