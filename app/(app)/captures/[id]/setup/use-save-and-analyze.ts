"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { FetchError, sendJson } from "@/lib/swr/fetcher";

/**
 * The submit step both set-up forms share: save the set-up (PUT to `setupPath` under the capture),
 * queue the analysis, then open the capture. The server's field errors and message are kept for
 * the form to show; `failure` is the message when the error has none.
 */
export function useSaveAndAnalyze(captureId: string, setupPath: "setup" | "interval-setup", failure: string) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  async function saveAndAnalyze(setup: unknown) {
    setErrors({});
    setBusy(true);
    try {
      await sendJson(`/api/captures/${captureId}/${setupPath}`, "PUT", setup);
      await sendJson(`/api/captures/${captureId}/analyze`, "POST");
      router.push(`/captures/${captureId}`);
      router.refresh();
    } catch (err) {
      if (err instanceof FetchError && err.fieldErrors) setErrors(err.fieldErrors);
      setMessage(err instanceof Error ? err.message : failure);
      setBusy(false);
    }
  }
  return { errors, setErrors, message, setMessage, busy, saveAndAnalyze };
}
