import { useState } from "react";
import { useRevalidator } from "react-router";

type Failure = { message: string; issues: { path: string; message: string }[] };

const COLUMN_FILE = /\.(dat|txt)$/i;
const ARRAY_FILE = /\.(h5|hdf5|he5|nc|cdf)$/i;

/**
 * Sends one file as the raw request body (so the server can stream it to storage) and shows
 * the upload's progress; fetch cannot report upload progress, XMLHttpRequest can. Column files
 * (.dat/.txt) go with the column map, HDF5 and NetCDF files with the dataset map; the server
 * keeps a map for the submission once a file was read with it.
 */
export function CsvUpload({
  action,
  kind,
  label,
  limitBytes,
  maps = {},
}: {
  action: string;
  kind: "series" | "spectrum";
  label: string;
  limitBytes: number;
  /** The submission's saved maps for this kind: columns, hdf5, netcdf. */
  maps?: { columns?: string; hdf5?: string; netcdf?: string };
}) {
  const first = kind === "series" ? "t" : "l";
  const [columnMap, setColumnMap] = useState(maps.columns ?? "");
  const [datasetMap, setDatasetMap] = useState(maps.hdf5 ?? maps.netcdf ?? "");
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
    const map = COLUMN_FILE.test(file.name) ? columnMap.trim() : ARRAY_FILE.test(file.name) ? datasetMap.trim() : "";
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `${action}?kind=${kind}&filename=${encodeURIComponent(file.name)}${map ? `&map=${encodeURIComponent(map)}` : ""}`);
    xhr.setRequestHeader("content-type", "application/octet-stream");
    xhr.upload.onprogress = (e) => e.lengthComputable && setProgress(Math.round((100 * e.loaded) / e.total));
    xhr.onload = () => {
      let body: { attachment?: { rowCount: number; columns: string[]; format?: string }; error?: Failure } = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = { error: { message: `The upload failed (status ${xhr.status}).`, issues: [] } };
      }
      setProgress(100);
      if (xhr.status >= 200 && xhr.status < 300 && body.attachment) {
        setDone(`Attached: ${body.attachment.rowCount} rows, columns ${body.attachment.columns.join(", ")} (${body.attachment.format ?? "CSV"}).`);
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
        CSV (RFC 4180) with a header row, first column {first}; or the files codes write: whitespace-separated columns (.dat, .txt: no header, # or ! comments, Fortran D
        exponents), HDF5 (.h5) or NetCDF classic / 64-bit offset (.nc) with the maps below. At most {Math.round(limitBytes / 1024 / 1024)} MB.
      </p>
      <label htmlFor={`${id}-columns`} className="text-caption font-semibold">
        Column map of .dat/.txt files (names in file order, "-" skips one)
      </label>
      <input id={`${id}-columns`} className="field-input font-mono" value={columnMap} onChange={(e) => setColumnMap(e.currentTarget.value)} placeholder={kind === "series" ? "t,kineticEnergy,-,Rm" : "l,kinetic,magnetic"} />
      <label htmlFor={`${id}-datasets`} className="text-caption font-semibold">
        Dataset map of .h5/.nc files (column, or column:path/in/file)
      </label>
      <input id={`${id}-datasets`} className="field-input font-mono" value={datasetMap} onChange={(e) => setDatasetMap(e.currentTarget.value)} placeholder={kind === "series" ? "t:time,kineticEnergy:ekin,Rm:diag/rm" : "l,kinetic,magnetic"} />
      <span className="text-caption text-basalt-soft">A map is kept for the submission once a file was read with it.</span>
      <label htmlFor={id} className="text-caption font-semibold">
        File
      </label>
      <input
        id={id}
        type="file"
        accept=".csv,text/csv,.dat,.txt,.h5,.hdf5,.nc"
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
