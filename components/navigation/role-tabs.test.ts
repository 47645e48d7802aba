// Proves which tabs each role sees, in order, and where each role lands after signing in.
import { describe, expect, it } from 'vitest';
import { ROLES } from '@/shared/domain/roles';
import { canOpenTab, homeTabFor, TABS, tabsForRole } from './role-tabs';

describe('tabsForRole', () => {
  // The role → tab table of the product brief, written out by hand.
  it.each([
    ['admin', ['bench', 'sign-off', 'lessons', 'team', 'account']],
    ['designer', ['bench', 'lessons', 'account']],
    ['reviewer', ['bench', 'sign-off', 'account']],
    ['educator', ['bench', 'lessons', 'account']],
    ['viewer', ['lessons', 'account']],
  ] as const)('%s sees %j', (role, expected) => {
    expect(tabsForRole(role).map((t) => t.id)).toEqual(expected);
  });

  it('gives every role the Account tab and only admins the Team tab', () => {
    for (const role of ROLES) {
      expect(canOpenTab(role, 'account')).toBe(true);
      expect(canOpenTab(role, 'team')).toBe(role === 'admin');
    }
  });

  it('keeps tab ids and titles unique', () => {
    expect(new Set(TABS.map((t) => t.id)).size).toBe(TABS.length);
    expect(new Set(TABS.map((t) => t.title)).size).toBe(TABS.length);
  });
});

describe('homeTabFor', () => {
  it('lands each role on its first tab', () => {
    expect(homeTabFor('designer')).toBe('bench');
    expect(homeTabFor('viewer')).toBe('lessons');
    for (const role of ROLES) expect(canOpenTab(role, homeTabFor(role))).toBe(true);
  });
});
