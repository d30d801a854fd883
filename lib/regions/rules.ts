// Who may do what with regions and comments: pure rules the routes enforce and the pages follow.
// Commenters add regions and comments and resolve or reopen regions; a region's shape, title and category are its
// author's to change (and any editor's); a comment is its author's to edit; owners may also remove others' comments.
import { mayActAs } from '@/lib/auth/roles';
import type { SiteRole, StudyRole } from '@/models/vocabulary';

export interface Actor {
  id: number;
  siteRole: SiteRole;
  myRole: StudyRole | null;
}

export function mayComment(actor: Actor): boolean {
  return mayActAs(actor.siteRole, actor.myRole, 'commenter');
}

/** Change a region's title, category or geometry, or delete it. */
export function mayChangeRegion(actor: Actor, authorId: number | null): boolean {
  return mayActAs(actor.siteRole, actor.myRole, 'editor') || (mayComment(actor) && authorId === actor.id);
}

export function mayEditComment(actor: Actor, authorId: number | null): boolean {
  return mayComment(actor) && authorId === actor.id;
}

export function mayDeleteComment(actor: Actor, authorId: number | null): boolean {
  return mayEditComment(actor, authorId) || mayActAs(actor.siteRole, actor.myRole, 'owner');
}

/** Define, rename, recolour and remove the study's region categories. */
export function mayManageCategories(actor: Actor): boolean {
  return mayActAs(actor.siteRole, actor.myRole, 'editor');
}
