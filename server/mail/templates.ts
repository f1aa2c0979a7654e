import type { Role } from '../../shared/roles';
import { ROLE_LABELS } from '../../shared/roles';
import type { OutgoingMail } from './mailer';

export function invitationMail(props: {
  to: string;
  displayName: string;
  role: Role;
  invitedBy: string;
  link: string;
  ttlHours: number;
}): OutgoingMail {
  return {
    to: props.to,
    subject: 'Your Flakeline invitation',
    text: [
      `Hello ${props.displayName},`,
      '',
      `${props.invitedBy} has invited you to the lab's Flakeline as a ${ROLE_LABELS[props.role].toLowerCase()}.`,
      "Flakeline keeps the lab's samples, their lineage and their thickness evidence.",
      '',
      'Choose your password here:',
      props.link,
      '',
      `The link works once and expires in ${props.ttlHours} hours.`,
    ].join('\n'),
  };
}

export function passwordResetMail(props: { to: string; displayName: string; link: string; ttlMinutes: number }): OutgoingMail {
  return {
    to: props.to,
    subject: 'Reset your Flakeline password',
    text: [
      `Hello ${props.displayName},`,
      '',
      'Someone (hopefully you) asked to reset your Flakeline password. Choose a new one here:',
      props.link,
      '',
      `The link works once and expires in ${props.ttlMinutes} minutes. If you did not ask, ignore this message; your password stays as it is.`,
    ].join('\n'),
  };
}
