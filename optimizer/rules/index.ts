// The rule catalogue: an explicit map from rule id to rule module (no discovery by file name),
// so what a scan runs is visible in one place.
import type { Rule } from './types';

export const RULES: Record<string, Rule> = {};
