import type { ErrorCode } from '../../../shared/contracts/common';

// Every error of the sign-in library (better-auth), in our own words. Its codes are stable;
// its messages are its own ("You have been banned from this application..."), so they never
// reach a user: the code picks our sentence, and a code we do not know gets the sentence of
// its status.

const words: Record<string, string> = {
  INVALID_EMAIL_OR_PASSWORD: 'The e-mail address or the password is not right.',
  INVALID_PASSWORD: 'The password is not right.',
  INVALID_EMAIL: 'That is not an e-mail address.',
  USER_NOT_FOUND: 'There is no account with that e-mail address.',
  CREDENTIAL_ACCOUNT_NOT_FOUND: 'This account has no password yet; ask an admin for a new invitation.',
  BANNED_USER: 'This account has been deactivated. Ask an admin of your desk if you need it again.',
  EMAIL_NOT_VERIFIED: 'This e-mail address has not been confirmed yet.',
  INVALID_TOKEN: 'This link is not valid any more: it was used already, or it has expired. Ask for a new one.',
  TOKEN_EXPIRED: 'This link has expired. Ask for a new one.',
  PASSWORD_TOO_SHORT: 'The password is too short: use at least 10 characters.',
  PASSWORD_TOO_LONG: 'The password is too long: use at most 128 characters.',
  USER_ALREADY_EXISTS: 'There is already an account with this e-mail address.',
  USER_ALREADY_EXISTS_USE_ANOTHER_EMAIL: 'There is already an account with this e-mail address.',
  SESSION_EXPIRED: 'Your session has expired. Sign in again.',
  FAILED_TO_CREATE_SESSION: 'You could not be signed in just now. Try again in a moment.',
  FAILED_TO_CREATE_USER: 'The account could not be created. Try again in a moment.',
  FAILED_TO_GET_SESSION: 'Your session could not be read. Sign in again.',
  INVALID_ORIGIN: 'Sign-in is accepted only from the pages of this app.',
  MISSING_OR_NULL_ORIGIN: 'Sign-in is accepted only from the pages of this app.',
  CROSS_SITE_NAVIGATION_LOGIN_BLOCKED: 'Sign-in is accepted only from the pages of this app.',
  INVALID_CALLBACK_URL: 'The page to return to after this step is not one of this app.',
  INVALID_REDIRECT_URL: 'The page to return to after this step is not one of this app.',
  INVALID_ERROR_CALLBACK_URL: 'The page to return to after this step is not one of this app.',
  VALIDATION_ERROR: 'Some fields are missing or not valid: check the e-mail address and the password.',
  MISSING_FIELD: 'A required field is missing.',
  BODY_MUST_BE_AN_OBJECT: 'Send the fields as a JSON object.',
  FIELD_NOT_ALLOWED: 'One of the fields may not be set here.',
  YOU_CANNOT_BAN_YOURSELF: 'You cannot deactivate your own account.',
  YOU_CANNOT_REMOVE_YOURSELF: 'You cannot remove your own account.',
  YOU_ARE_NOT_ALLOWED_TO_BAN_USERS: 'Your role may not deactivate accounts.',
  YOU_ARE_NOT_ALLOWED_TO_CHANGE_USERS_ROLE: 'Your role may not change roles.',
  YOU_ARE_NOT_ALLOWED_TO_CREATE_USERS: 'Your role may not create accounts.',
  YOU_ARE_NOT_ALLOWED_TO_UPDATE_USERS: 'Your role may not change accounts.',
  YOU_ARE_NOT_ALLOWED_TO_LIST_USERS: 'Your role may not list accounts.',
  YOU_ARE_NOT_ALLOWED_TO_SET_USERS_PASSWORD: "Your role may not set another person's password.",
  NO_DATA_TO_UPDATE: 'Nothing to change was sent.',
};

const byStatus: Record<number, { code: ErrorCode; message: string }> = {
  400: { code: 'bad_request', message: 'The request was not accepted: check what you entered and try again.' },
  401: { code: 'unauthorized', message: 'Sign in first.' },
  403: { code: 'forbidden', message: 'This is not allowed for your account.' },
  404: { code: 'not_found', message: 'There is no such sign-in page or account.' },
  405: { code: 'bad_request', message: 'This sign-in address does not take that method.' },
  409: { code: 'conflict', message: 'This cannot be done in the current state of the account.' },
  413: { code: 'payload_too_large', message: 'The request body is too large.' },
  422: { code: 'unprocessable', message: 'Some fields are not valid.' },
  429: { code: 'rate_limited', message: 'Too many attempts from your address. Wait a minute and try again.' },
};

/** Our status code and sentence for an error the sign-in library answered with. */
export function authErrorWords(status: number, libraryCode: string | undefined): { code: ErrorCode; message: string } {
  const base = byStatus[status] ?? { code: status >= 500 ? 'internal' : 'bad_request', message: status >= 500 ? 'Something went wrong on the server; it has been logged.' : 'The request was not accepted.' };
  const message = libraryCode ? words[libraryCode] : undefined;
  return { code: base.code, message: message ?? base.message };
}

/** Codes our own sign-in guard uses: their message is already ours. */
export const ownAuthCodes = new Set(['ADDRESS_LOCKED', 'ACCOUNT_LOCKED']);
