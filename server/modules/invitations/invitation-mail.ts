import { linkMail, untilWords } from '../../mail/link-mail';
import { roleLabels, type ProjectRole } from '../../../shared/schemas/roles';

export function invitationMail(input: { projectName: string; projectCode: string; role: ProjectRole; inviterName: string; href: string; expiresAt: Date }) {
  const role = input.role === 'pi' ? roleLabels.pi : roleLabels[input.role].toLowerCase();
  return linkMail({
    subject: `Starledger: ${input.inviterName} invites you to ${input.projectName}`,
    title: `An invitation to ${input.projectName}`,
    paragraphs: [
      `${input.inviterName} invites you to join ${input.projectName} (${input.projectCode}) on Starledger as ${role}.`,
      'If you have no Starledger account yet, you choose your name and a password when you accept. If you have one under this address, you sign in and the project joins your list.',
    ],
    action: 'Accept the invitation',
    href: input.href,
    validity: untilWords(input.expiresAt),
    footer: 'You receive this because a lead astronomer entered this address on a project’s members page. If you did not expect it, ignore it: nothing happens unless the link is used.',
  });
}
