import { compose } from "./compose";

export function verifyEmailMessage(name: string, url: string) {
  return compose({
    subject: "Confirm your e-mail address for Runproof",
    greeting: `Hello ${name},`,
    paragraphs: [
      "Someone (we hope you) created a Runproof account with this address.",
      "Confirm the address to finish setting up the account. The link works once and expires in one hour.",
    ],
    action: { label: "Confirm my address", url },
  });
}

export function resetPasswordMessage(name: string, url: string) {
  return compose({
    subject: "Choose a new Runproof password",
    greeting: `Hello ${name},`,
    paragraphs: [
      "A new password was requested for your Runproof account.",
      "If that was not you, ignore this message: your password stays as it is.",
    ],
    action: { label: "Choose a new password", url },
  });
}
