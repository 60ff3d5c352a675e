export { sendMail, type OutgoingMail } from "./send";
export { escapeHtml, inviteMail, passwordResetMail, signInLinkMail, type MailContent } from "./templates";
