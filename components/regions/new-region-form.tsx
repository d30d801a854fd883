'use client';

// Saving a shape as a region: its title, category and first comment. Used for shapes drawn or typed on a view and
// for a Separation's proposed region (the shape comes from the caller).
import { useState } from 'react';
import type { RegionGeometry } from '@/lib/physics/plane/region';
import type { RegionCategoryView, RegionView } from '@/lib/regions/shapes';
import { REGION_TITLE_MAX } from '@/models/vocabulary';
import { Button } from '../button';
import { controlClass } from '../fields';
import { Notice } from '../notice';
import { CommentComposer, type MentionCandidate } from './comment-composer';
import { useCreateRegion } from './use-create-region';

interface NewRegionFormProps {
  studyId: number;
  entryId: number | null;
  geometry: RegionGeometry;
  /** The shape in words (shape-text.ts). */
  shapeText: string;
  categories: readonly RegionCategoryView[];
  members: readonly MentionCandidate[];
  defaultTitle?: string;
  onCreated: (region: RegionView) => void;
  onCancel: () => void;
}

export function NewRegionForm({ studyId, entryId, geometry, shapeText, categories, members, defaultTitle = '', onCreated, onCancel }: NewRegionFormProps) {
  const { create, pending, error } = useCreateRegion(studyId);
  const [title, setTitle] = useState(defaultTitle);
  const [categoryId, setCategoryId] = useState<string>('');
  const [comment, setComment] = useState('');

  async function save() {
    const region = await create({ title, categoryId: categoryId ? Number(categoryId) : null, comment, entryId, geometry });
    if (region) onCreated(region);
  }

  return (
    <form
      aria-label="New region"
      className="space-y-3 rounded-md border border-accent/30 bg-accent-soft/30 p-3"
      onSubmit={(event) => {
        event.preventDefault();
        void save();
      }}
    >
      <p className="text-sm font-semibold">New region</p>
      <p className="font-mono text-xs text-ink-soft" data-testid="pending-shape">
        {shapeText}
      </p>
      <label className="block space-y-1 text-sm font-medium">
        Title
        <input className={controlClass} value={title} maxLength={REGION_TITLE_MAX} onChange={(event) => setTitle(event.target.value)} required />
      </label>
      <label className="block space-y-1 text-sm font-medium">
        Category
        <select className={controlClass} value={categoryId} onChange={(event) => setCategoryId(event.target.value)}>
          <option value="">No category</option>
          {categories.map((category) => (
            <option key={category.id} value={category.id}>
              {category.name}
            </option>
          ))}
        </select>
      </label>
      <CommentComposer value={comment} onChange={setComment} members={members} label="First comment" placeholder="What is here, and what should be checked?" onSubmit={save} />
      {error && <Notice tone="error">{error}</Notice>}
      <div className="flex gap-2">
        <Button type="submit" size="sm" variant="primary" disabled={pending || !title.trim() || !comment.trim()}>
          {pending ? 'Saving…' : 'Save region'}
        </Button>
        <Button type="button" size="sm" variant="ghost" onClick={onCancel}>
          Discard
        </Button>
      </div>
    </form>
  );
}
