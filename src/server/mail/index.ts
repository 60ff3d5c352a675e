export { sendMail, type OutgoingMail } from "./send";
export {
  accountExistsMail,
  confirmAddressMail,
  escapeHtml,
  inviteMail,
  passwordResetMail,
  signInLinkMail,
  type MailContent,
} from "./templates";
export { deliverSoon, drainOutbox, queueMail } from "./outbox";
