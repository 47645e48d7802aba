// defineRule and message rendering: every rule has the same shape (meta + find), and messages are
// declared once by id with {placeholders} that the engine fills, refusing unknown ids.
import type { z } from 'zod';
import { InternalError } from '../errors';
import type { Rule } from './types';

const ID = /^[a-z][a-z0-9]*(-[a-z0-9]+)*$/;

export function defineRule<S extends z.ZodType>(rule: Rule<S>): Rule<S> {
  if (!ID.test(rule.id)) throw new InternalError(`rule id "${rule.id}" is not kebab-case`);
  if (Object.keys(rule.meta.messages).length === 0) throw new InternalError(`rule ${rule.id} declares no messages`);
  // The defaults must satisfy the rule's own schema, or every scan would start from bad options.
  const parsed = rule.meta.optionsSchema.safeParse(rule.meta.defaultOptions);
  if (!parsed.success) throw new InternalError(`rule ${rule.id}: default options do not match its schema`);
  return rule;
}

/** Fills a message template; unknown ids and missing placeholders are a rule's bug. */
export function renderMessage(
  ruleId: string,
  messages: Record<string, string>,
  messageId: string,
  data: Record<string, string | number> = {},
): string {
  if (!Object.prototype.hasOwnProperty.call(messages, messageId)) {
    throw new InternalError(`rule ${ruleId} reported unknown message id "${messageId}"`);
  }
  return messages[messageId].replace(/\{(\w+)\}/g, (_, key: string) => {
    if (!Object.prototype.hasOwnProperty.call(data, key)) {
      throw new InternalError(`rule ${ruleId} message "${messageId}" needs {${key}} but the data lacks it`);
    }
    return String(data[key]);
  });
}
