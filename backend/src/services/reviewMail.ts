/**
 * Review and release e-mails: their wording, and delivery with a record in mail_deliveries so a
 * failed send is never lost (status, error, attempts) and can be retried.
 */
import type { Transaction } from 'sequelize';
import { MailDelivery } from '../models';
import type { Mailer, OutgoingMail } from './mail/mailer';

export interface MailContext {
  mailer?: Mailer;
  /** Absolute base of links in mails (PUBLIC_URL), without a trailing slash; '' = relative. */
  baseUrl: string;
}

/** Creates the delivery record (pending) for a mail about to be sent. */
export async function recordDelivery(kind: string, revisionId: number | null, mail: OutgoingMail, now: Date, transaction?: Transaction): Promise<MailDelivery> {
  return MailDelivery.create(
    { kind, revisionId, to: mail.to, subject: mail.subject, status: mail.to.length ? 'pending' : 'sent', error: mail.to.length ? null : 'No recipients.', createdAt: now },
    { transaction },
  );
}

/** Sends one recorded mail; a failure is written to the record, never thrown. */
export async function attemptDelivery(ctx: MailContext, delivery: MailDelivery, mail: OutgoingMail, now: Date): Promise<MailDelivery> {
  if (!mail.to.length) return delivery;
  const attempts = delivery.attempts + 1;
  try {
    if (!ctx.mailer) throw new Error('No mail transport is configured.');
    await ctx.mailer.send(mail);
    await delivery.update({ status: 'sent', error: null, attempts, lastAttemptAt: now });
  } catch (err) {
    const message = err instanceof Error ? err.message : String(err);
    await delivery.update({ status: 'failed', error: message.slice(0, 2000), attempts, lastAttemptAt: now });
  }
  return delivery;
}

/** Records and sends in one go (for mails that need no later retry by the caller). */
export async function deliver(ctx: MailContext, kind: string, revisionId: number | null, mail: OutgoingMail, now: Date): Promise<MailDelivery> {
  return attemptDelivery(ctx, await recordDelivery(kind, revisionId, mail, now), mail, now);
}

export interface RevisionMailFacts {
  projectName: string;
  projectId: number;
  revisionId: number;
  layoutName: string;
  letter: string;
}

const link = (ctx: MailContext, path: string) => `${ctx.baseUrl}${path}`;

/** To reviewers: a revision waits for review. */
export function submittedMail(ctx: MailContext, f: RevisionMailFacts, to: string[], submitter: string): OutgoingMail {
  return {
    to,
    subject: `${f.projectName}: revision ${f.letter} of ${f.layoutName} submitted for review`,
    text:
      `${submitter} submitted revision ${f.letter} of the cell layout "${f.layoutName}" (project ${f.projectName}) for review.\n\n` +
      `Review it here: ${link(ctx, `/projects/${f.projectId}/revisions/${f.revisionId}`)}\n`,
  };
}

/** To the submitting planner: the reviewer's decision. */
export function decidedMail(ctx: MailContext, f: RevisionMailFacts, to: string[], reviewer: string, decision: 'sign_off' | 'return', comment: string): OutgoingMail {
  const what = decision === 'sign_off' ? 'signed off' : 'returned for changes';
  return {
    to,
    subject: `${f.projectName}: revision ${f.letter} of ${f.layoutName} ${decision === 'sign_off' ? 'signed off' : 'returned for changes'}`,
    text:
      `${reviewer} ${what} revision ${f.letter} of the cell layout "${f.layoutName}" (project ${f.projectName}).\n\n` +
      (comment ? `Reviewer's note:\n${comment}\n\n` : '') +
      `Open it here: ${link(ctx, `/projects/${f.projectId}/revisions/${f.revisionId}`)}\n`,
  };
}

/** To the project's clients: the released plan sheet, attached. */
export function releasedMail(ctx: MailContext, f: RevisionMailFacts, to: string[], pdf: Buffer): OutgoingMail {
  return {
    to,
    subject: `${f.projectName}: plan sheet, revision ${f.letter} released`,
    text:
      `Revision ${f.letter} of the cell layout "${f.layoutName}" for ${f.projectName} has been released. The plan sheet is attached (PDF).\n\n` +
      `You can also view it and acknowledge receipt here: ${link(ctx, `/projects/${f.projectId}/revisions/${f.revisionId}`)}\n\n` +
      'Reach regions and distances on the sheet are planning estimates from nominal kinematics. They do not replace the risk ' +
      'assessment (ISO 12100), the robot-system safety requirements (ISO 10218-2) or the arm maker’s stopping data; final ' +
      'safeguarding must be designed and validated by a competent person under local codes and regulations.\n',
    attachments: [{ filename: `${f.projectName.replace(/[^A-Za-z0-9._-]+/g, '-')}-revision-${f.letter}.pdf`, content: pdf, contentType: 'application/pdf' }],
  };
}

/** To an invited person: the one-time link. */
export function invitationMail(ctx: MailContext, to: string, roleWord: string, token: string, expiresAt: Date, inviter: string): OutgoingMail {
  return {
    to: [to],
    subject: 'Your invitation to Ringfence',
    text:
      `${inviter} invited you to Ringfence as ${roleWord}.\n\n` +
      `Set your name and password here (the link works once and expires ${expiresAt.toISOString().replace('T', ' ').slice(0, 16)} UTC):\n` +
      `${link(ctx, `/invite/${token}`)}\n`,
  };
}
