// Proves the tab bars list only the role's tabs, mark the focused one, and navigate on press
// unless a listener prevents it.
import { describe, expect, it } from 'vitest';
import { navItems } from './nav-items';

type Emitted = { type: string; target?: string; canPreventDefault?: boolean };

function fakeNavigator(focused: string, prevent = false) {
  const names = ['bench', 'sign-off', 'lessons', 'team', 'account'];
  const routes = names.map((name) => ({ key: `${name}-key`, name, params: undefined }));
  const emitted: Emitted[] = [];
  const navigated: string[] = [];
  const state = { routes, index: names.indexOf(focused) };
  const navigation = {
    emit: (event: Emitted) => {
      emitted.push(event);
      return { defaultPrevented: prevent };
    },
    navigate: (name: string) => navigated.push(name),
  };
  // The navigator types carry far more than the tab bar reads; only these fields are used.
  return { props: { state, navigation } as unknown as Parameters<typeof navItems>[0], emitted, navigated };
}

describe('navItems', () => {
  it('lists only the tabs of the role, in order, with the focused one marked', () => {
    const nav = fakeNavigator('lessons');
    const items = navItems(nav.props, 'viewer');
    expect(items.map((i) => [i.id, i.focused])).toEqual([
      ['lessons', true],
      ['account', false],
    ]);
  });

  it('navigates to a pressed tab after announcing the press', () => {
    const nav = fakeNavigator('bench');
    const team = navItems(nav.props, 'admin').find((i) => i.id === 'team')!;
    team.onPress();
    expect(nav.emitted).toEqual([{ type: 'tabPress', target: 'team-key', canPreventDefault: true }]);
    expect(nav.navigated).toEqual(['team']);
  });

  it('does not navigate when the tab is already focused or the press is prevented', () => {
    const focused = fakeNavigator('account');
    navItems(focused.props, 'designer').find((i) => i.id === 'account')!.onPress();
    expect(focused.navigated).toEqual([]);

    const prevented = fakeNavigator('bench', true);
    navItems(prevented.props, 'designer').find((i) => i.id === 'lessons')!.onPress();
    expect(prevented.navigated).toEqual([]);
  });

  it('keeps the parent tab lit on a route inside it, and navigates back to the tab on press', () => {
    const nav = fakeNavigator('bench');
    const props = { ...nav.props, state: { routes: [...nav.props.state.routes, { key: 'designs-key', name: 'designs', params: undefined }], index: 5 } } as unknown as Parameters<typeof navItems>[0];
    const items = navItems(props, 'designer');
    expect(items.map((i) => [i.id, i.focused])).toEqual([
      ['bench', true],
      ['lessons', false],
      ['account', false],
    ]);
    items[0].onPress();
    expect(nav.navigated).toEqual(['bench']);
  });

  it('skips a tab the navigator does not have', () => {
    const nav = fakeNavigator('bench');
    const props = { ...nav.props, state: { ...nav.props.state, routes: nav.props.state.routes.filter((r) => r.name !== 'sign-off') } };
    expect(navItems(props, 'reviewer').map((i) => i.id)).toEqual(['bench', 'account']);
  });
});
