export { sendMail, type OutgoingMail } from "./send";
export { escapeHtml, inviteMail, passwordResetMail, signInLinkMail, type MailContent } from "./templates";
export { deliverSoon, drainOutbox, queueMail } from "./outbox";
