// The rule catalogue: an explicit map from rule id to rule module (no discovery by file name),
// so what a scan runs is visible in one place.
import type { Rule } from './types';
import { commonOverride } from './common-override';
import { constantInput } from './constant-input';
import { doubleInversion } from './double-inversion';
import { mergeDuplicateLogic } from './merge-duplicate-logic';
import { sharedControlDriver } from './shared-control-driver';
import { sharedEnableSwitch } from './shared-enable-switch';
import { tristateSlim } from './tristate-slim';
import { twoLevelMinimise } from './two-level-minimise';

export const RULES: Record<string, Rule> = {
  [commonOverride.id]: commonOverride as unknown as Rule,
  [constantInput.id]: constantInput as unknown as Rule,
  [doubleInversion.id]: doubleInversion as unknown as Rule,
  [mergeDuplicateLogic.id]: mergeDuplicateLogic as unknown as Rule,
  [sharedControlDriver.id]: sharedControlDriver as unknown as Rule,
  [sharedEnableSwitch.id]: sharedEnableSwitch as unknown as Rule,
  [tristateSlim.id]: tristateSlim as unknown as Rule,
  [twoLevelMinimise.id]: twoLevelMinimise as unknown as Rule,
};
