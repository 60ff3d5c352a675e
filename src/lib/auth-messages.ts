/**
 * Sentences of the sign-in forms that the server sends and the browser recognises: the password
 * form shows "send the link again" beside UNCONFIRMED, so both sides must spell it the same.
 */
export const MISMATCH = "That e-mail and password don't match.";

export const UNCONFIRMED =
  "Confirm your e-mail address first: open the link we e-mailed you when you created the account.";
