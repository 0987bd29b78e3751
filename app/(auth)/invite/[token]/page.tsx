import Link from "next/link";
import { AcceptInvitationForm } from "@/components/auth/accept-invitation-form";
import { ROLE_LABELS } from "@/lib/auth/permissions";
import { AppError } from "@/lib/errors";
import { previewInvitation, type InvitationPreview } from "@/lib/services/team";
import { acceptInvitationAction } from "./actions";

export const metadata = { title: "Join a team" };

export default async function InvitePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  let preview: InvitationPreview | null = null;
  let problem: string | null = null;
  try {
    preview = await previewInvitation(token);
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    problem = error.message;
  }
  if (!preview) {
    return (
      <>
        <h1 className="mb-2 text-lg font-semibold">Invitation</h1>
        <p role="alert" className="text-sm text-flag-700">
          {problem}
        </p>
        <p className="mt-4 text-sm">
          <Link className="text-frost-600 underline" href="/sign-in">
            Go to sign-in
          </Link>
        </p>
      </>
    );
  }
  return (
    <>
      <h1 className="mb-1 text-lg font-semibold">Join {preview.teamName}</h1>
      <p className="mb-4 text-sm text-ink-muted">You are invited as {ROLE_LABELS[preview.role].toLowerCase()}.</p>
      <AcceptInvitationForm token={token} email={preview.email} accept={acceptInvitationAction} />
    </>
  );
}
