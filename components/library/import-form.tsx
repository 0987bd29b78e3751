"use client";

import Link from "next/link";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { sendJson, settle } from "@/lib/api/client";

type Result = { models: { id: number; name: string; created: boolean; versionIds: number[] }[]; versions: number };

/** Import a Heatpath library file as team drafts. */
export function ImportForm() {
  const [text, setText] = useState<string | null>(null);
  const [file, setFile] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [result, setResult] = useState<Result | null>(null);

  async function choose(f: File | undefined) {
    setError(null);
    setResult(null);
    if (!f) return;
    setFile(f.name);
    try {
      setText(new TextDecoder("utf-8", { fatal: true }).decode(await f.arrayBuffer()));
    } catch {
      setText(null);
      setError("The file is not UTF-8 text.");
    }
  }

  async function submit() {
    if (!text) return;
    setBusy(true);
    setError(null);
    let body: unknown;
    try {
      body = JSON.parse(text);
    } catch {
      setBusy(false);
      return setError("The file is not valid JSON.");
    }
    const answer = await settle(sendJson<Result>("POST", "/api/v1/library/import", body));
    setBusy(false);
    if (!answer.ok) return setError(answer.error.message);
    setResult(answer.data);
  }

  return (
    <div className="space-y-3">
      <input type="file" accept=".json,application/json" onChange={(e) => void choose(e.target.files?.[0])} aria-label="Library file" className="block w-full text-sm" />
      <Button onClick={() => void submit()} disabled={!text || busy}>
        {busy ? "Importing…" : `Import${file ? ` ${file}` : ""} as drafts`}
      </Button>
      {error && (
        <p role="alert" className="text-sm text-flag-700">
          {error}
        </p>
      )}
      {result && (
        <div role="status" className="rounded-md border border-moss-600/30 bg-moss-50 p-3 text-sm">
          <p className="font-medium text-moss-700">
            Imported {result.versions} version{result.versions === 1 ? "" : "s"} as drafts.
          </p>
          <ul className="mt-1 list-disc pl-5">
            {result.models.map((m) => (
              <li key={m.id}>
                {m.name}
                {m.created ? " (new model)" : ""}:{" "}
                {m.versionIds.map((id) => (
                  <Link key={id} className="mr-2 text-frost-700 underline" href={`/library/versions/${id}`}>
                    #{id}
                  </Link>
                ))}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
