import type { ReactNode } from "react";
import type { BandDraft } from "./editor-draft";

/** One of a band's lists (order rows, aggregates): an editor per item and an "Add" button under them. */
export function BandList<T>({
  title,
  items,
  select,
  empty,
  addLabel,
  addTestId,
  update,
  children,
}: {
  title: string;
  items: T[];
  /** The same list in the band being edited. */
  select: (band: BandDraft) => T[];
  empty: (band: BandDraft) => T;
  addLabel: string;
  addTestId?: string;
  update: (fn: (band: BandDraft) => void) => void;
  children: (item: T, index: number, edit: { onChange: (patch: Partial<T>) => void; onRemove: () => void }) => ReactNode;
}) {
  return (
    <div className="space-y-2">
      <h3 className="text-sm font-semibold">{title}</h3>
      <ol className="space-y-2">
        {items.map((item, i) =>
          children(item, i, {
            onChange: (patch) => update((d) => void (select(d)[i] = { ...select(d)[i]!, ...patch })),
            onRemove: () => update((d) => void select(d).splice(i, 1)),
          }),
        )}
      </ol>
      <button type="button" className="btn-quiet py-1" data-testid={addTestId} onClick={() => update((d) => void select(d).push(empty(d)))}>
        {addLabel}
      </button>
    </div>
  );
}

/** One item of a band list: its title and Remove button above its fields (`children`). */
export function BandListItem({ title, testId, removeTestId, onRemove, children }: { title: string; testId: string; removeTestId?: string; onRemove: () => void; children: ReactNode }) {
  return (
    <li className="rounded-md border border-line/70 p-2" data-testid={testId}>
      <div className="mb-1 flex items-center justify-between text-xs text-ink-muted">
        <span>{title}</span>
        <button type="button" className="text-fail hover:underline" onClick={onRemove} data-testid={removeTestId}>Remove</button>
      </div>
      {children}
    </li>
  );
}
