import type { OutgoingMail } from '../mail/mail-delivery';

/** The mail to an account's owner after repeated wrong passwords locked the account. */
export function unlockMessage(appUrl: string, to: string, name: string, token: string, validMinutes: number): OutgoingMail {
  return {
    to,
    subject: '[Sheathwise] Your account was locked after wrong passwords',
    text:
      `Hello ${name},\n\nSeveral wrong passwords were entered for your Sheathwise account, so signing in to it is paused for a while. ` +
      `If that was you, open this link to unlock the account now (it works once, for ${validMinutes} minutes):\n\n` +
      `${appUrl}/signin/unlock?token=${token}\n\n` +
      'If it was not you, someone may be guessing your password: you need do nothing, the lock protects the account, ' +
      'but tell your administrator if this message keeps coming.',
  };
}
