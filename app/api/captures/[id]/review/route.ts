import { NextResponse } from "next/server";
import { getCaptureById, getUserContact, recordReview } from "@/db/queries/captures";
import { captureParamsSchema } from "@/lib/api/params";
import { readJson, withAuth } from "@/lib/api/with-auth";
import { can } from "@/lib/auth/permissions";
import { authoriseCaptureEdit } from "@/lib/auth/session";
import { AppError } from "@/lib/errors";
import { appUrl, sendMail } from "@/lib/mail/send";
import { reviewActionSchema } from "@/lib/validations/capture";

const subjects = { approved: "approved", sent_back: "sent back for changes" } as const;

// POST /api/captures/:id/review — submit for review, approve, send back (with reason) or comment
export const POST = withAuth<{ id: string }>(
  async ({ req, params, user }) => {
    const { id } = captureParamsSchema.parse(params);
    if (!can(user.role, "captures:upload") && !can(user.role, "captures:review")) {
      throw new AppError("forbidden", "Your role does not allow this.");
    }
    const { action, comment } = reviewActionSchema.parse(await readJson(req));
    // Submitting and commenting belong to whoever uploads; the verdicts are the engineer's.
    const needed = action === "approved" || action === "sent_back" ? "captures:review" : "captures:upload";
    if (!can(user.role, needed)) throw new AppError("forbidden", "Your role does not allow this.");
    const current = await getCaptureById({ id, reader: user });
    // A technician submits only a capture they uploaded, and comments only on their own.
    if (user.role === "technician") {
      if (action === "submitted") authoriseCaptureEdit(user, current);
      else if (current.uploadedBy !== user.id) throw new AppError("forbidden", "Technicians comment only on the captures they uploaded.");
    }
    const capture = await recordReview({ captureId: id, action, comment, actorId: user.id });
    if (action === "approved" || action === "sent_back") {
      const uploader = await getUserContact({ id: capture.uploadedBy });
      if (uploader) {
        await sendMail({
          to: uploader.email,
          subject: `Ordwise: "${capture.title}" ${subjects[action]}`,
          text: [
            `Hello ${uploader.name},`,
            "",
            `${user.name} has ${subjects[action]} the capture "${capture.title}".`,
            ...(comment ? ["", `Comment: ${comment}`] : []),
            "",
            `Open the sheet: ${appUrl(`/captures/${capture.id}`)}`,
          ].join("\n"),
        });
      }
    }
    return NextResponse.json({ reviewState: capture.reviewState });
  },
  { permission: "captures:read" },
);
