/** What every new-password field says: length, and that a phrase of words is the easy strong choice. */
export const NEW_PASSWORD_HINT =
  'At least 10 characters. A phrase of three or four unrelated words is strong and easy to remember.';
