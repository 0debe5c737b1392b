import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import * as common from '@zxcvbn-ts/language-common';
import * as english from '@zxcvbn-ts/language-en';

/**
 * How hard a password would be to guess, by zxcvbn-ts (Dropbox's zxcvbn
 * estimator: common passwords, names, English words, keyboard patterns,
 * dates, l33t). It is loaded only where a new password is chosen
 * (PasswordStrength imports this module on demand), so its dictionaries
 * stay out of the main bundle. The server's rules decide what is accepted
 * (server/lib/passwords.ts); this only helps choose (ASVS 2.1.8).
 */
const zxcvbn = new ZxcvbnFactory({
  dictionary: { ...common.dictionary, ...english.dictionary },
  graphs: common.adjacencyGraphs,
  translations: english.translations,
});

export interface Strength {
  /** 0 (guessed at once) to 4 (very hard to guess), zxcvbn's scale. */
  score: 0 | 1 | 2 | 3 | 4;
  /** What makes it weak, when something does. */
  warning: string | null;
  suggestions: string[];
}

/** `userInputs`: the account's e-mail and name, whole and in words, so that a password made of them counts as easy. */
export function estimateStrength(password: string, userInputs: string[]): Strength {
  const words = userInputs.flatMap((s) => [s, ...s.split(/[^\p{L}\p{N}]+/u)]).filter((w) => w.length >= 3);
  const result = zxcvbn.check(password, [...words, 'starledger']);
  return { score: result.score as Strength['score'], warning: result.feedback.warning || null, suggestions: result.feedback.suggestions };
}
