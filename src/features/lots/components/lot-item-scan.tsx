// Picking lot items for promotion by their printed item label: type or scan it and press Enter;
// the item joins the selection. The field is read when Enter arrives (no debounce), so a scanner
// that types faster than any look-up works the first time. Matching ignores case.
import { useRef, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import type { LotItems } from '../api/types';

export function LotItemScan({
  items,
  selected,
  onSelectedChange,
}: {
  items: LotItems;
  selected: Set<number>;
  onSelectedChange: (ids: Set<number>) => void;
}) {
  const field = useRef<HTMLInputElement>(null);
  const [note, setNote] = useState<{ ok: boolean; text: string } | null>(null);
  const submit = (e: FormEvent) => {
    e.preventDefault();
    const typed = (field.current?.value ?? '').trim();
    if (!typed) return setNote({ ok: false, text: 'Type or scan an item label.' });
    const wanted = typed.toLowerCase();
    const k = items.items.findIndex((item) => item.toLowerCase() === wanted);
    if (k < 0) return setNote({ ok: false, text: `No item of this lot is labelled “${typed}”.` });
    const id = items.ids[k]!;
    const next = new Set(selected);
    next.add(id);
    onSelectedChange(next);
    setNote({ ok: true, text: `${items.items[k]} selected (${next.size} in the selection).` });
    if (field.current) field.current.value = '';
  };
  return (
    <form onSubmit={submit} noValidate className="mb-3 flex flex-wrap items-end gap-2" aria-label="Select an item by its label">
      <TextField
        ref={field}
        label="Item label"
        autoComplete="off"
        spellCheck={false}
        inputClassName="num"
        placeholder="A-0007"
        hint={
          note ? (
            <span className={note.ok ? 'text-pass' : 'text-fail'} aria-live="polite">
              {note.text}
            </span>
          ) : (
            'Type or scan, then Enter: the item joins the selection to promote.'
          )
        }
      />
      <Button type="submit" size="sm" variant="secondary" className="mb-6">
        Select
      </Button>
    </form>
  );
}
