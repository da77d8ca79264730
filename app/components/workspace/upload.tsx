import { useState } from "react";
import { useRevalidator } from "react-router";

type Failure = { message: string; issues: { path: string; message: string }[] };

/**
 * Sends one file as the raw request body (so the server can stream it to storage) and shows
 * the upload's progress; fetch cannot report upload progress, XMLHttpRequest can.
 */
export function CsvUpload({ action, kind, label, limitBytes }: { action: string; kind: "series" | "spectrum"; label: string; limitBytes: number }) {
  const [progress, setProgress] = useState<number | null>(null);
  const [failure, setFailure] = useState<Failure | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const revalidator = useRevalidator();
  const id = `upload-${kind}`;

  function send(file: File) {
    setFailure(null);
    setDone(null);
    // Checked here too so nobody waits for 25 MB to travel only to be refused; the server enforces it again.
    if (file.size > limitBytes) {
      setProgress(null);
      setFailure({
        message: `The file "${file.name}" is larger than the upload limit of ${Math.round(limitBytes / 1024 / 1024)} MB; nothing was stored. Thin the series (e.g. every n-th row) or split it, then upload again.`,
        issues: [],
      });
      return;
    }
    setProgress(0);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `${action}?kind=${kind}&filename=${encodeURIComponent(file.name)}`);
    xhr.setRequestHeader("content-type", "text/csv");
    xhr.upload.onprogress = (e) => e.lengthComputable && setProgress(Math.round((100 * e.loaded) / e.total));
    xhr.onload = () => {
      let body: { attachment?: { rowCount: number; columns: string[] }; error?: Failure } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = { error: { message: `The upload failed (status ${xhr.status}).`, issues: [] } };
      }
      setProgress(100);
      if (xhr.status >= 200 && xhr.status < 300 && body.attachment) {
        setDone(`Attached: ${body.attachment.rowCount} rows, columns ${body.attachment.columns.join(", ")}.`);
        void revalidator.revalidate();
      } else setFailure(body.error ?? { message: `The upload failed (status ${xhr.status}).`, issues: [] });
    };
    xhr.onerror = () => setFailure({ message: "The connection broke during the upload; nothing was stored. Try again.", issues: [] });
    xhr.send(file);
  }

  return (
    <div className="flex flex-col gap-1" data-testid={id}>
      <label htmlFor={id} className="font-semibold">
        {label}
      </label>
      <p className="text-caption text-basalt-soft">
        CSV (RFC 4180) with a header row, first column {kind === "series" ? "t" : "l"}; at most {Math.round(limitBytes / 1024 / 1024)} MB.
      </p>
      <input
        id={id}
        type="file"
        accept=".csv,text/csv"
        className="field-input"
        onChange={(e) => {
          const file = e.currentTarget.files?.[0];
          if (file) send(file);
          e.currentTarget.value = "";
        }}
      />
      {progress !== null ? <progress max={100} value={progress} aria-label={`Upload of the ${kind}`} data-testid={`${id}-progress`} className="w-full" /> : null}
      <p role="status" className="text-caption">
        {done}
      </p>
      {failure ? (
        <div role="alert" className="rounded border border-ember bg-ember-wash p-2 text-caption text-ember" data-testid={`${id}-error`}>
          <p>{failure.message}</p>
          <ul className="list-disc pl-5">
            {failure.issues.map((i) => (
              <li key={i.path + i.message}>
                <span className="font-semibold">{i.path}</span>: {i.message}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
