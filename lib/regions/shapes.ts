// The JSON of the regions, comments, categories and activity routes. Types only, so pages import them.
import type { RegionGeometry } from '@/lib/physics/plane/region';
import type { RegionState } from '@/models/vocabulary';

export interface PersonRef {
  id: number;
  name: string;
}

export interface RegionCategoryView {
  id: number;
  name: string;
  /** #rrggbb */
  colour: string;
}

export interface RegionView {
  id: number;
  studyId: number;
  /** The view it was drawn on (null: drawn elsewhere, or that entry is gone). */
  entryId: number | null;
  title: string;
  geometry: RegionGeometry;
  state: RegionState;
  category: RegionCategoryView | null;
  /** null once that account is gone. */
  createdBy: PersonRef | null;
  createdAt: string;
  /** Who last resolved or reopened it, and when. */
  stateChangedBy: PersonRef | null;
  stateChangedAt: string | null;
  /** Comments that are not deleted. */
  commentCount: number;
  lastCommentAt: string | null;
}

export interface CommentView {
  id: number;
  regionId: number;
  author: PersonRef | null;
  replyToId: number | null;
  /** Markdown; empty for a deleted comment. */
  body: string;
  editedAt: string | null;
  deleted: boolean;
  createdAt: string;
}

export type ActivityKind = 'entry' | 'sample' | 'region' | 'comment' | 'region-resolved' | 'region-reopened';

export interface ActivityItem {
  kind: ActivityKind;
  /** Unique within the feed ("comment:12"). */
  key: string;
  actor: PersonRef | null;
  /** Plain text: what was added ("Map “Quark jets”", "region “Wide-angle excess”"). */
  what: string;
  /** A path inside the product. */
  link: string;
  at: string;
  /** Newer than the reader's last visit and not their own. */
  unread: boolean;
}

export interface ActivityFeed {
  items: ActivityItem[];
  unreadCount: number;
  /** When the reader last marked the feed as read (null: never). */
  seenAt: string | null;
}
