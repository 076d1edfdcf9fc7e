/**
 * The e-mails of a review: the request to each reviewer, and each decision to the requester.
 * Plain text and a simple HTML twin, each with the link written out in full.
 * (The shape matches the mail sender's `OutgoingMail`; the route hands it over.)
 */
export interface ReviewMail {
  to: string;
  subject: string;
  text: string;
  html: string;
}

const escapeHtml = (value: string) =>
  value.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function render(to: string, subject: string, paragraphs: string[], link: { href: string; label: string }): ReviewMail {
  const html = `<!doctype html><html><body style="font-family:system-ui,sans-serif;color:#1c2430">
${paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`).join('\n')}
<p><a href="${escapeHtml(link.href)}" style="color:#8e431f">${escapeHtml(link.label)}</a></p>
<p style="color:#4a5565;font-size:13px">${escapeHtml(link.href)}</p>
</body></html>`;
  return { to, subject, text: `${paragraphs.join('\n\n')}\n\n${link.href}\n`, html };
}

/** The link a reviewer follows: `${appUrl}/review/${revisionId}`. */
export function reviewLink(appUrl: string, revisionId: number): string {
  return `${appUrl.replace(/\/+$/, '')}/review/${revisionId}`;
}

/** Asks one reviewer to review a revision. */
export function reviewRequestMail(input: {
  to: string;
  reviewerName: string;
  requesterName: string;
  planName: string;
  programName: string;
  revisionLabel: string;
  changeSummary: string;
  message: string;
  link: string;
}): ReviewMail {
  const paragraphs = [
    `Hello ${input.reviewerName},`,
    `${input.requesterName} asks you to review revision ${input.revisionLabel} of "${input.planName}" (${input.programName}).`,
    `Change summary: ${input.changeSummary}`,
    ...(input.message ? [`Message: ${input.message}`] : []),
    'Open the revision below to read it, comment on its stages and checks, and approve it or ask for changes with your password as signature.',
  ];
  return render(input.to, `Review requested: ${input.planName}, revision ${input.revisionLabel}`, paragraphs, {
    href: input.link,
    label: `Review revision ${input.revisionLabel}`,
  });
}

/** Tells the requester about one reviewer's decision (and the release when it completes the review). */
export function reviewDecisionMail(input: {
  to: string;
  signerName: string;
  meaning: 'approved' | 'changes-requested';
  planName: string;
  revisionLabel: string;
  note: string;
  outcome: 'pending' | 'approved' | 'changes-requested';
  link: string;
}): ReviewMail {
  const decision = input.meaning === 'approved' ? 'approved' : 'asked for changes to';
  const outcomeLine =
    input.outcome === 'approved'
      ? `Every requested reviewer has approved: revision ${input.revisionLabel} is now released.`
      : input.outcome === 'changes-requested'
        ? `Revision ${input.revisionLabel} is marked "changes requested"; make the changes in the plan and freeze a new revision.`
        : 'The review waits for the other requested reviewers.';
  const paragraphs = [
    `${input.signerName} ${decision} revision ${input.revisionLabel} of "${input.planName}" (signed with their password).`,
    ...(input.note ? [`Note: ${input.note}`] : []),
    outcomeLine,
  ];
  const verb = input.meaning === 'approved' ? 'Approved' : 'Changes requested';
  return render(input.to, `${verb}: ${input.planName}, revision ${input.revisionLabel}`, paragraphs, {
    href: input.link,
    label: `Open revision ${input.revisionLabel}`,
  });
}
