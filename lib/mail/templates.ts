/** Plain texts of Tapernote's e-mails; each returns the subject, a text part and a simple HTML part. */

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function page(lines: string[], link: { href: string; label: string }): string {
  return `<div style="font-family:sans-serif;color:#1D2433;background:#FAF7F0;padding:24px">${lines
    .map((l) => `<p>${escapeHtml(l)}</p>`)
    .join("")}<p><a href="${escapeHtml(link.href)}" style="color:#B4532A">${escapeHtml(link.label)}</a></p></div>`;
}

export function verifyEmailMail(name: string, url: string) {
  const lines = [`Hello ${name},`, "please confirm your e-mail address for Tapernote by opening this link:"];
  return {
    subject: "Confirm your e-mail address for Tapernote",
    text: `${lines.join("\n")}\n\n${url}\n\nIf you did not sign up, ignore this message.`,
    html: page(lines, { href: url, label: "Confirm my e-mail address" }),
  };
}

export function resetPasswordMail(name: string, url: string) {
  const lines = [`Hello ${name},`, "someone asked to reset your Tapernote password. To choose a new one, open:"];
  return {
    subject: "Reset your Tapernote password",
    text: `${lines.join("\n")}\n\n${url}\n\nThe link works for one hour. If it was not you, ignore this message.`,
    html: page(lines, { href: url, label: "Choose a new password" }),
  };
}

export function invitationMail(studioName: string, inviterName: string, role: string, url: string) {
  const lines = [
    `${inviterName} invited you to the studio "${studioName}" on Tapernote as ${role}.`,
    "To accept, open this link (sign in or create an account with this e-mail address):",
  ];
  return {
    subject: `Invitation to ${studioName} on Tapernote`,
    text: `${lines.join("\n")}\n\n${url}\n\nThe invitation expires in 7 days.`,
    html: page(lines, { href: url, label: "Accept the invitation" }),
  };
}

export function receiptMail(name: string, credits: number, price: string, reference: string) {
  const lines = [
    `Hello${name ? ` ${name}` : ""},`,
    `thank you for your purchase: ${credits} export credits for ${price}.`,
    `The credits are now in your studio's balance. Reference: ${reference}.`,
  ];
  return {
    subject: `Your Tapernote receipt: ${credits} export credits`,
    text: `${lines.join("\n")}\n\nThis is your receipt; keep it for your records.`,
    html: `<div style="font-family:sans-serif;color:#1D2433;background:#FAF7F0;padding:24px">${lines.map((l) => `<p>${escapeHtml(l)}</p>`).join("")}</div>`,
  };
}

export function commentMail(author: string, takeName: string, body: string, url: string) {
  const excerpt = body.length > 300 ? `${body.slice(0, 300)}…` : body;
  const lines = [`${author} commented on "${takeName}":`, excerpt, "Open the take to read it and reply:"];
  return {
    subject: `New comment on ${takeName}`,
    text: `${lines.join("\n\n")}\n\n${url}`,
    html: page(lines, { href: url, label: "Open the take" }),
  };
}
