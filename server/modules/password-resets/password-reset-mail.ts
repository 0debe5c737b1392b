import { linkMail, untilWords } from '../../mail/link-mail';

export function passwordResetMail(input: { name: string; href: string; expiresAt: Date }) {
  return linkMail({
    subject: 'Starledger: set a new password',
    title: 'Set a new password',
    paragraphs: [
      `${input.name}, someone (we hope you) asked to set a new password for your Starledger account.`,
      'Setting it signs you out everywhere you are signed in; your API tokens keep working.',
    ],
    action: 'Choose a new password',
    href: input.href,
    validity: untilWords(input.expiresAt),
    footer: 'You receive this because this address was entered under “Forgot your password?”. If that was not you, ignore it: your password stays as it is.',
  });
}
