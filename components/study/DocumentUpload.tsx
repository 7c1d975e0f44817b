"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/** Uploads one document with a progress bar (XMLHttpRequest reports upload progress; fetch does not). */
export function DocumentUpload({ studyId }: { studyId: number }) {
  const router = useRouter();
  const [progress, setProgress] = useState<number | null>(null);
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const onSubmit = (e: React.FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const form = new FormData(e.currentTarget);
    const file = form.get("file");
    if (!(file instanceof File) || file.size === 0) {
      setMessage({ ok: false, text: "Choose a file first." });
      return;
    }
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/studies/${studyId}/documents`);
    xhr.upload.onprogress = (ev) => ev.lengthComputable && setProgress(Math.round((ev.loaded / ev.total) * 100));
    xhr.onload = () => {
      setProgress(null);
      if (xhr.status < 300) {
        setMessage({ ok: true, text: `Uploaded ${file.name}.` });
        router.refresh();
      } else {
        let text = `Upload refused (${xhr.status}).`;
        try {
          text = (JSON.parse(xhr.responseText) as { error: { message: string } }).error.message;
        } catch {}
        setMessage({ ok: false, text });
      }
    };
    xhr.onerror = () => {
      setProgress(null);
      setMessage({ ok: false, text: "The upload failed: check the connection and try again." });
    };
    setMessage(null);
    setProgress(0);
    xhr.send(form);
  };
  return (
    <form onSubmit={onSubmit} className="card max-w-xl space-y-3">
      <h2>Upload a document</h2>
      <div><label htmlFor="doc-kind">What is it?</label>
        <select id="doc-kind" name="kind" className="input"><option value="approval_letter">Ethics approval letter</option><option value="protocol">Protocol document</option><option value="other">Other</option></select>
      </div>
      <div><label htmlFor="doc-file">File (PDF, PNG or JPEG, up to 10 MB)</label><input id="doc-file" name="file" type="file" accept="application/pdf,image/png,image/jpeg" className="input" /></div>
      {progress !== null && (
        <div>
          <progress aria-label="Upload progress" max={100} value={progress} className="w-full" />
          <p className="text-xs">{progress} % sent</p>
        </div>
      )}
      {message && <p className={message.ok ? "notice" : "field-error"} role={message.ok ? "status" : "alert"}>{message.text}</p>}
      <button className="btn" disabled={progress !== null}>Upload</button>
    </form>
  );
}
