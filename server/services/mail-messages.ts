// The wording of every message Rootplate sends. Each has a plain-text and an
// HTML part, names the shop, and carries no secret beyond its one link.
// Anything a member typed (a share's note) is set apart and marked as theirs,
// so it never reads as Rootplate's own words.
import { roleLabels, type ShopRole } from '../../shared/utils/permissions'

export interface MailContent { subject: string; text: string; html: string }

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', '\'': '&#39;' })[c]!)

/** Text a member wrote, quoted and marked as theirs. */
export interface MemberWords { author: string; text: string }

export const memberWordsHeading = (author: string) => `${author} wrote (their own words, not Rootplate's):`

function layout(shopName: string, paragraphs: (string | MemberWords)[], link: { href: string; label: string }, footer: string): string {
  const body = paragraphs.map(p => typeof p === 'string'
    ? `<p style="margin:0 0 12px">${escapeHtml(p).replace(/\n/g, '<br>')}</p>`
    : `<p style="margin:0 0 4px;font-size:13px;color:#5b6660">${escapeHtml(memberWordsHeading(p.author))}</p><blockquote style="margin:0 0 12px;padding:4px 12px;border-left:3px solid #c9d1cb;white-space:pre-wrap">${escapeHtml(p.text)}</blockquote>`).join('')
  return `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#1f2a24;max-width:560px;margin:0 auto;padding:16px">
<p style="margin:0 0 16px;font-weight:600;color:#2f5d46">Rootplate · ${escapeHtml(shopName)}</p>
${body}
<p style="margin:20px 0"><a href="${escapeHtml(link.href)}" style="background:#2f5d46;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(link.label)}</a></p>
<p style="margin:0 0 12px;font-size:13px;color:#5b6660">If the button does not work, copy this address into your browser:<br>${escapeHtml(link.href)}</p>
<p style="margin:16px 0 0;font-size:12px;color:#7a847e">${escapeHtml(footer)}</p>
</body></html>`
}

export function invitationMail(input: { shopName: string; inviterName: string; role: ShopRole; link: string; days: number }): MailContent {
  const role = roleLabels[input.role].toLowerCase()
  const intro = `${input.inviterName} has asked you to join ${input.shopName} on Rootplate as a ${role}. Rootplate is where the shop designs the plywood plates under its rolling scenery and prints their templates and cut files.`
  const how = `Open the link below to choose your name and password. It works once and for ${input.days} days.`
  const footer = `If you were not expecting this, ignore this message: nothing happens unless the link is opened.`
  return {
    subject: `Join ${input.shopName} on Rootplate`,
    text: `${intro}\n\n${how}\n\n${input.link}\n\n${footer}\n`,
    html: layout(input.shopName, [intro, how], { href: input.link, label: `Join ${input.shopName}` }, footer),
  }
}

export function passwordResetMail(input: { shopName: string; name: string; link: string }): MailContent {
  const intro = `Hello ${input.name}, someone (we hope you) asked to set a new password for your Rootplate account at ${input.shopName}.`
  const how = 'Open the link below within one hour to choose a new password. It works once; setting the password signs your account out everywhere else.'
  const footer = 'If you did not ask for this, ignore this message: your password stays as it is.'
  return {
    subject: `Set a new Rootplate password (${input.shopName})`,
    text: `${intro}\n\n${how}\n\n${input.link}\n\n${footer}\n`,
    html: layout(input.shopName, [intro, how], { href: input.link, label: 'Choose a new password' }, footer),
  }
}

export function shareMail(input: { shopName: string; senderName: string; designName: string; revision: number; note: string; link: string; expiresOn: string }): MailContent {
  const intro = `${input.senderName} at ${input.shopName} has sent you the cut files for "${input.designName}" (revision ${input.revision}).`
  const note: MemberWords | null = input.note ? { author: input.senderName, text: input.note } : null
  const how = `The link below opens a page with the DXF and SVG cut files and the full-size template. No account is needed. It stops working on ${input.expiresOn} or when the shop withdraws it.`
  const footer = `Questions about the parts go to ${input.shopName}; reply to them directly rather than to this message.`
  const paragraphs = [intro, ...(note ? [note] : []), how]
  // In plain text the note is quoted line by line, so it cannot pass for the message around it.
  const asText = (p: string | MemberWords) => typeof p === 'string' ? p : `${memberWordsHeading(p.author)}\n${p.text.split(/\r?\n/).map(l => `> ${l}`).join('\n')}`
  return {
    subject: `Cut files from ${input.shopName}: ${input.designName}`,
    text: `${paragraphs.map(asText).join('\n\n')}\n\n${input.link}\n\n${footer}\n`,
    html: layout(input.shopName, paragraphs, { href: input.link, label: 'Open the cut files' }, footer),
  }
}
