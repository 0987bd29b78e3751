"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { sendJson, settle } from "@/lib/api/client";

export function CommentForm({ caseId, revision }: { caseId: number; revision: number | null }) {
  const router = useRouter();
  const [body, setBody] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function post(e: React.FormEvent) {
    e.preventDefault();
    if (!body.trim()) {
      setError("Write a comment.");
      return;
    }
    setBusy(true);
    const answer = await settle(sendJson("POST", `/api/v1/cases/${caseId}/comments`, revision ? { body, revision } : { body }));
    setBusy(false);
    if (!answer.ok) setError(answer.error.fields?.body ?? answer.error.message);
    else {
      setBody("");
      setError(null);
      router.refresh();
    }
  }
  return (
    <form onSubmit={post} className="space-y-2">
      <label htmlFor="comment-body" className="block text-sm font-medium text-ink-soft">
        Add a comment{revision ? ` on revision ${revision}` : ""}
      </label>
      <textarea id="comment-body" className={inputClass} rows={2} value={body} onChange={(e) => setBody(e.target.value)} aria-invalid={error ? true : undefined} />
      {error && (
        <p role="alert" className="text-xs font-medium text-flag-700">
          {error}
        </p>
      )}
      <Button type="submit" variant="secondary" disabled={busy}>
        Post comment
      </Button>
    </form>
  );
}
