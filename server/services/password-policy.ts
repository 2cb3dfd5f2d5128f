import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common';
import { badRequest } from '../errors';

// Strength as zxcvbn estimates it (Wheeler 2016, "zxcvbn: Low-Budget Password Strength Estimation"),
// with its list of common passwords, names and keyboard patterns, all shipped in the npm package.
const estimator = new ZxcvbnFactory({ dictionary, graphs: adjacencyGraphs });

export const MIN_PASSWORD_LENGTH = 10;
/** zxcvbn score 0-4; 3 means "safely unguessable: moderate protection from offline attack". */
const MIN_SCORE = 3;

const WARNINGS: Record<string, string> = {
  common: 'it is one of the most common passwords',
  topTen: 'it is one of the ten most common passwords',
  topHundred: 'it is one of the hundred most common passwords',
  similarToCommon: 'it is a common password with small changes',
  simpleRepeat: 'it repeats the same characters',
  extendedRepeat: 'it repeats the same pattern',
  sequences: 'it is a sequence such as abcdef or 654321',
  straightRow: 'it is a row of keys on the keyboard',
  keyPattern: 'it is a pattern on the keyboard',
  namesByThemselves: 'it is a name',
  userInputs: 'it contains your name or e-mail address',
  dates: 'it is a date',
  recentYears: 'it is a recent year',
  wordByItself: 'it is a single word',
};

/**
 * Refuses a new password that is short or easy to guess, naming the field and saying why. Length is
 * what matters: a phrase of a few words passes, no mix of character classes is required.
 */
export function checkNewPassword(password: string, field: string, about: readonly string[] = []): void {
  let why: string | null = null;
  if (password.length < MIN_PASSWORD_LENGTH) why = `use at least ${MIN_PASSWORD_LENGTH} characters`;
  else {
    const result = estimator.check(password, [...about]);
    if (result.score < MIN_SCORE) {
      const warning = result.feedback.warning ? WARNINGS[result.feedback.warning] : undefined;
      why = `it is too easy to guess${warning ? ` (${warning})` : ''}; a phrase of three or four unrelated words works well`;
    }
  }
  if (why) {
    throw badRequest('validation_failed', `${field}: choose another password: ${why}`, {
      issues: [{ path: [field], code: 'weak_password', message: `Choose another password: ${why}` }],
    });
  }
}
