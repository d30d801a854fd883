import { describe, expect, it } from 'vitest';
import { canSeeStudy, mayActAs, ownersAfterChange, roleAtLeast } from '@/lib/auth/roles';
import { STUDY_ROLES } from '@/models/vocabulary';

describe('study roles', () => {
  it('orders viewer < commenter < editor < owner', () => {
    const allowed = STUDY_ROLES.map((role) => STUDY_ROLES.filter((minimum) => roleAtLeast(role, minimum)));
    expect(allowed).toEqual([
      ['viewer'],
      ['viewer', 'commenter'],
      ['viewer', 'commenter', 'editor'],
      ['viewer', 'commenter', 'editor', 'owner'],
    ]);
  });

  it('gives no role nothing', () => {
    expect(STUDY_ROLES.some((minimum) => roleAtLeast(null, minimum))).toBe(false);
  });

  it('lets members and site admins see a study, nobody else', () => {
    expect(canSeeStudy('member', 'viewer')).toBe(true);
    expect(canSeeStudy('admin', null)).toBe(true);
    expect(canSeeStudy('member', null)).toBe(false);
  });

  it('lets a site admin act as any role, a member only as far as their role goes', () => {
    expect(mayActAs('admin', null, 'owner')).toBe(true);
    expect(mayActAs('member', 'editor', 'editor')).toBe(true);
    expect(mayActAs('member', 'editor', 'owner')).toBe(false);
    expect(mayActAs('member', null, 'viewer')).toBe(false);
  });
});

describe('owners after a change', () => {
  it.each([
    [1, 'owner', 'editor', 0],
    [1, 'owner', null, 0],
    [2, 'owner', null, 1],
    [1, 'viewer', 'owner', 2],
    [1, 'editor', null, 1],
    [1, 'owner', 'owner', 1],
  ] as const)('%i owners, %s becomes %s: %i owners', (owners, from, to, expected) => {
    expect(ownersAfterChange(owners, from, to)).toBe(expected);
  });
});
