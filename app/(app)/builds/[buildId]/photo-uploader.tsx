"use client";

import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { sendJson } from "@/components/builds/api";

const TYPES = ["image/jpeg", "image/png", "image/webp"];
const MAX_BYTES = 10 * 1024 * 1024;

/** Picks an image, asks for a presigned PUT, sends the bytes straight to storage, then completes. */
export function PhotoUploader({ buildId }: { buildId: number }) {
  const router = useRouter();
  const fileRef = useRef<HTMLInputElement>(null);
  const [caption, setCaption] = useState("");
  const [state, setState] = useState<{ busy: boolean; error: string | null; ok: string | null }>({ busy: false, error: null, ok: null });

  async function upload() {
    const file = fileRef.current?.files?.[0];
    if (!file) return setState({ busy: false, error: "Choose a photo first", ok: null });
    // The server checks both again; this only saves a pointless upload.
    if (!TYPES.includes(file.type)) return setState({ busy: false, error: "Choose a JPEG, PNG or WebP image", ok: null });
    if (file.size > MAX_BYTES) return setState({ busy: false, error: "Photos are limited to 10 MB", ok: null });
    setState({ busy: true, error: null, ok: null });
    try {
      const { photoId, putUrl, contentType } = await sendJson<{ photoId: number; putUrl: string; contentType: string }>(`/api/builds/${buildId}/photos`, "POST", {
        fileName: file.name,
        contentType: file.type,
        size: file.size,
        caption: caption || undefined,
      });
      const put = await fetch(putUrl, { method: "PUT", body: file, headers: { "content-type": contentType } });
      if (!put.ok) throw new Error(`Storage refused the photo (HTTP ${put.status})`);
      await sendJson(`/api/builds/${buildId}/photos/${photoId}/complete`, "POST", {});
      setCaption("");
      if (fileRef.current) fileRef.current.value = "";
      setState({ busy: false, error: null, ok: "Photo added." });
      router.refresh();
    } catch (e) {
      setState({ busy: false, error: (e as Error).message, ok: null });
    }
  }

  return (
    <form
      className="mt-4 grid gap-3 sm:grid-cols-[minmax(0,1fr)_minmax(0,1fr)_auto] sm:items-end"
      onSubmit={(e) => {
        e.preventDefault();
        void upload();
      }}
    >
      <div>
        <label htmlFor="photo-file" className="field-label">
          Photo (JPEG, PNG or WebP, up to 10 MB)
        </label>
        <input id="photo-file" ref={fileRef} type="file" accept="image/jpeg,image/png,image/webp" className="field-input" />
      </div>
      <div>
        <label htmlFor="photo-caption" className="field-label">
          Caption (optional)
        </label>
        <input id="photo-caption" className="field-input" value={caption} maxLength={200} onChange={(e) => setCaption(e.target.value)} />
      </div>
      <button type="submit" className="btn-quiet" disabled={state.busy}>
        {state.busy ? "Uploading…" : "Add photo"}
      </button>
      <div role="status" aria-live="polite" className="min-h-5 text-sm sm:col-span-3">
        {state.error && <span className="text-act">{state.error}</span>}
        {state.ok && <span className="text-clear">{state.ok}</span>}
      </div>
    </form>
  );
}

export function DeletePhotoButton({ buildId, photoId, name }: { buildId: number; photoId: number; name: string }) {
  const router = useRouter();
  const [busy, setBusy] = useState(false);
  return (
    <button
      type="button"
      className="text-sm text-act underline disabled:opacity-60"
      disabled={busy}
      aria-label={`Remove photo ${name}`}
      onClick={async () => {
        if (!window.confirm(`Remove the photo “${name}”?`)) return;
        setBusy(true);
        try {
          await sendJson(`/api/builds/${buildId}/photos/${photoId}`, "DELETE");
          router.refresh();
        } finally {
          setBusy(false);
        }
      }}
    >
      Remove
    </button>
  );
}
