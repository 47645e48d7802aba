// The rule catalogue: an explicit map from rule id to rule module (no discovery by file name),
// so what a scan runs is visible in one place.
import type { Rule } from './types';
import { doubleInversion } from './double-inversion';

export const RULES: Record<string, Rule> = {
  [doubleInversion.id]: doubleInversion as unknown as Rule,
};
