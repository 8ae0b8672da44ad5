// The text of the e-mails Ringdown sends. Plain text first; every message carries its link.
import { ROLE_LABELS, type Role } from '../roles';

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

export function sessionAnalysedMail(p: { roomName: string; condition: string; analysed: number; failed: number; link: string }) {
	const captures = (n: number) => `${n} capture${n === 1 ? '' : 's'}`;
	const outcome = p.failed === 0 ? `${captures(p.analysed)} analysed` : `${captures(p.analysed)} analysed, ${p.failed} failed`;
	return {
		subject: `${p.roomName}, ${p.condition}: ${outcome}`,
		text: [
			`All captures of the visit "${p.condition}" in ${p.roomName} have been through the analysis.`,
			'',
			`Analysed: ${p.analysed}`,
			`Failed:   ${p.failed}${p.failed ? ' — open the visit to see why, and measure again while you can.' : ''}`,
			'',
			p.link
		].join('\n')
	};
}

export function reportPublishedMail(p: { clientName: string; roomName: string; title: string; link: string }) {
	return {
		subject: `Your report is ready: ${p.roomName}`,
		text: [
			`Hello ${p.clientName},`,
			'',
			`The report "${p.title}" for ${p.roomName} is ready. It shows how the room measured before and after the treatment, in charts and in plain words, with your consultant's advice.`,
			'',
			'Read it (and download the PDF) here:',
			p.link
		].join('\n')
	};
}
