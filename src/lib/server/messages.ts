// The text of the e-mails Ringdown sends. Plain text first; every message carries its link.
import { ROLE_LABELS, type Role } from '$lib/roles';

export function invitationMail(p: { organizationName: string; role: Role; link: string; inviterName: string }) {
	return {
		subject: `You are invited to ${p.organizationName} on Ringdown`,
		text: [
			`${p.inviterName} invites you to join ${p.organizationName} on Ringdown as ${ROLE_LABELS[p.role].toLowerCase()}.`,
			'',
			'Set your password and sign in here (the link works once and expires in 7 days):',
			p.link,
			'',
			'If you did not expect this, ignore this message.'
		].join('\n')
	};
}

export function passwordResetMail(p: { link: string }) {
	return {
		subject: 'Reset your Ringdown password',
		text: [
			'Someone asked to reset the password of this Ringdown account.',
			'',
			'Choose a new password here (the link works once and expires in 2 hours):',
			p.link,
			'',
			'If it was not you, ignore this message: your password stays as it is.'
		].join('\n')
	};
}
