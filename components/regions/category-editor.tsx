'use client';

// The study's region categories, for editors: add one with a name and a colour, recolour or remove one (its
// regions stay, without a category).
import { useState } from 'react';
import { messageOf, sendJson } from '@/lib/api/client';
import type { RegionCategoryView } from '@/lib/regions/shapes';
import { REGION_CATEGORY_NAME_MAX } from '@/models/vocabulary';
import { Button } from '../button';
import { inlineSelectClass } from '../fields';
import { Notice } from '../notice';

/** First colours offered, from the figures' own palette of distinct hues. */
const SUGGESTED = ['#cc6677', '#117733', '#332288', '#ddcc77', '#88ccee', '#aa4499'];

export function CategoryEditor({ studyId, categories, onChanged }: { studyId: number; categories: readonly RegionCategoryView[]; onChanged: () => void }) {
  const [name, setName] = useState('');
  const [colour, setColour] = useState(SUGGESTED[categories.length % SUGGESTED.length]);
  const [error, setError] = useState<string | null>(null);
  const url = `/api/studies/${studyId}/region-categories`;
  async function run(work: () => Promise<unknown>) {
    setError(null);
    try {
      await work();
      onChanged();
    } catch (failure) {
      setError(messageOf(failure));
    }
  }
  return (
    <details className="text-sm">
      <summary className="cursor-pointer text-ink-soft">Categories ({categories.length})</summary>
      <ul className="mt-2 space-y-1">
        {categories.map((category) => (
          <li key={category.id} className="flex items-center gap-2">
            <input
              type="color"
              aria-label={`Colour of ${category.name}`}
              value={category.colour}
              onChange={(event) => run(() => sendJson('PATCH', `${url}/${category.id}`, { colour: event.target.value }))}
            />
            <span className="flex-1">{category.name}</span>
            <Button size="sm" variant="ghost" onClick={() => run(() => sendJson('DELETE', `${url}/${category.id}`))}>
              Remove
            </Button>
          </li>
        ))}
      </ul>
      <form
        className="mt-2 flex flex-wrap items-center gap-2"
        onSubmit={(event) => {
          event.preventDefault();
          void run(async () => {
            await sendJson('POST', url, { name, colour });
            setName('');
          });
        }}
      >
        <input className={`${inlineSelectClass} w-40`} aria-label="New category name" placeholder="New category" value={name} maxLength={REGION_CATEGORY_NAME_MAX} onChange={(event) => setName(event.target.value)} />
        <input type="color" aria-label="New category colour" value={colour} onChange={(event) => setColour(event.target.value)} />
        <Button size="sm" type="submit" disabled={!name.trim()}>
          Add
        </Button>
      </form>
      {error && <Notice tone="error">{error}</Notice>}
    </details>
  );
}
