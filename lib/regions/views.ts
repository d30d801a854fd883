// How regions, their comments and categories look in API answers.
import type { Region } from '@/models/region';
import type { RegionCategory } from '@/models/region-category';
import type { RegionComment } from '@/models/region-comment';
import type { User } from '@/models/user';
import type { CommentView, PersonRef, RegionCategoryView, RegionView } from './shapes';

export function personRef(user: User | null | undefined): PersonRef | null {
  return user ? { id: user.id, name: user.name } : null;
}

const iso = (date: Date | null | undefined) => (date ? new Date(date).toISOString() : null);

export function categoryView(category: RegionCategory): RegionCategoryView {
  return { id: category.id, name: category.name, colour: category.colour };
}

/** A region loaded with its category and people, and counted comments. */
export function regionView(region: Region, comments: { count: number; last: Date | null }): RegionView {
  return {
    id: region.id,
    studyId: region.studyId,
    entryId: region.entryId,
    title: region.title,
    geometry: region.geometry,
    state: region.state,
    category: region.category ? categoryView(region.category) : null,
    createdBy: personRef(region.createdBy),
    createdAt: iso(region.createdAt)!,
    stateChangedBy: personRef(region.stateChangedBy),
    stateChangedAt: iso(region.stateChangedAt),
    commentCount: comments.count,
    lastCommentAt: iso(comments.last),
  };
}

export function commentView(comment: RegionComment): CommentView {
  const deleted = comment.deletedAt !== null;
  return {
    id: comment.id,
    regionId: comment.regionId,
    author: personRef(comment.author),
    replyToId: comment.replyToId,
    body: deleted ? '' : comment.body,
    editedAt: iso(comment.editedAt),
    deleted,
    createdAt: iso(comment.createdAt)!,
  };
}
