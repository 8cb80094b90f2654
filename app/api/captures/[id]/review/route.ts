import { NextResponse } from "next/server";
import { getCaptureById, getUserContact, listReviewerContacts, recordReview } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { can } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { appUrl, escapeHtml, sendMail } from "@/lib/mail/send";
import { reviewActionSchema } from "@/lib/validations/capture";

const subjects = { approved: "approved", sent_back: "sent back for changes", submitted: "submitted for review" } as const;

/** One notification: plain text plus an HTML part with the sheet as a clickable absolute link. */
function notice({ to, name, line, comment, captureId, title }: { to: string; name: string; line: string; comment: string; captureId: string; title: string; }) {
  const link = appUrl(`/captures/${captureId}`);
  return {
    to,
    subject: title,
    text: [`Hello ${name},`, "", line, ...(comment ? ["", `Comment: ${comment}`] : []), "", `Open the sheet: ${link}`].join("\n"),
    html: [
      `<p>Hello ${escapeHtml(name)},</p>`,
      `<p>${escapeHtml(line)}</p>`,
      ...(comment ? [`<p>Comment: ${escapeHtml(comment)}</p>`] : []),
      `<p><a href="${escapeHtml(link)}">Open the sheet</a></p>`,
    ].join("\n"),
  };
}

// POST /api/captures/:id/review — submit for review, approve (naming the evaluation), send back (with reason) or comment
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    if (!can(user.role, "captures:upload") && !can(user.role, "captures:review")) {
      throw new AppError("forbidden", "Your role does not allow this.");
    }
    const { action, comment, evaluationId } = reviewActionSchema.parse(await readJson(req));
    // Submitting and commenting belong to whoever uploads; the verdicts are the engineer's.
    const needed = action === "approved" || action === "sent_back" ? "captures:review" : "captures:upload";
    if (!can(user.role, needed)) throw new AppError("forbidden", "Your role does not allow this.");
    const current = await getCaptureById({ id, reader: user });
    // A technician submits and comments only on captures they uploaded; whether the capture's state
    // allows a submission is the review state machine's answer (409 naming what is allowed).
    if (user.role === "technician" && current.uploadedBy !== user.id) {
      throw new AppError("forbidden", action === "submitted" ? "Technicians submit only the captures they uploaded." : "Technicians comment only on the captures they uploaded.");
    }
    const capture = await recordReview({ captureId: id, action, comment, actorId: user.id, evaluationId });
    if (action === "approved" || action === "sent_back") {
      const uploader = await getUserContact({ id: capture.uploadedBy });
      if (uploader) {
        await sendMail(
          notice({
            to: uploader.email,
            name: uploader.name,
            line: `${user.name} has ${subjects[action]} the capture "${capture.title}".`,
            comment,
            captureId: capture.id,
            title: `Ordwise: "${capture.title}" ${subjects[action]}`,
          }),
        );
      }
    }
    if (action === "submitted") {
      // Every active engineer hears of it; the one who submitted is not told about their own action.
      for (const engineer of await listReviewerContacts()) {
        if (engineer.email === user.email) continue;
        await sendMail(
          notice({
            to: engineer.email,
            name: engineer.name,
            line: `${user.name} has submitted the capture "${capture.title}" for review.`,
            comment,
            captureId: capture.id,
            title: `Ordwise: "${capture.title}" ${subjects.submitted}`,
          }),
        );
      }
    }
    return NextResponse.json({ reviewState: capture.reviewState, approvedEvaluationId: capture.approvedEvaluationId });
  },
  { permission: "captures:read" },
);
