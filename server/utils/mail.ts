import { MailNotConfigured, sendMail, type OutgoingMail } from '../services/mail'

/** Sends a message; a missing or failing mail server becomes a clear 503/502 for the person who asked. */
export async function deliverMail(mail: OutgoingMail, whatWasKept: string): Promise<void> {
  try {
    await sendMail(mail)
  }
  catch (err: unknown) {
    if (err instanceof MailNotConfigured) {
      throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: `${whatWasKept}, but this server has no mail set up (SMTP_URL), so nothing was sent.` })
    }
    console.error('mail: sending failed:', err instanceof Error ? err.message : err)
    throw createError({ statusCode: 502, statusMessage: 'Bad Gateway', message: `${whatWasKept}, but the mail server refused the message. Try again in a moment.` })
  }
}
