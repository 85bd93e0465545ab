import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '@counterpoise/api';

/** The rule of a new password, stated before anyone types: length only, no composition rules. */
export const PASSWORD_RULE = `At least ${PASSWORD_MIN_LENGTH} characters, at most ${PASSWORD_MAX_LENGTH}. Spaces are welcome: a few words in a row make a strong password.`;
