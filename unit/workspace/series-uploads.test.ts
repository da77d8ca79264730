/**
 * Series uploads in the formats codes write, through the app's attachment service and the check
 * job: whitespace-separated columns with Fortran `D` exponents (ISO/IEC 1539, the Dw.d edit
 * descriptor: `1.5D+02` is 150), HDF5 written here with h5wasm (the HDF Group's library compiled to
 * WebAssembly), NetCDF classic written from the published format specification (Unidata, "The
 * NetCDF Classic Format Specification"; see netcdf-writer.ts), since netcdfjs only reads.
 * The stored analysis is compared with the values written and with simple-statistics' mean.
 */
import { ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import h5wasm from "h5wasm";
import { mean } from "simple-statistics";
import { eq, like } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attachments, rounds, storedFiles, submissions, user, venues } from "~db/schema";
import { env } from "~/config/env.server";
import { attachCsv } from "~/workspace/attachments.server";
import { recheckRound } from "~/workspace/recheck.server";
import { addRun } from "~/workspace/run-edits.server";
import { createSubmission } from "~/workspace/submissions.server";
import { InvalidInput } from "~/workspace/types";
import { netcdf } from "../checker/netcdf-writer";
import { testDatabase } from "../support/test-db";

const { db, sql } = testDatabase();
const s3 = new S3Client({
  endpoint: env.S3_ENDPOINT,
  region: env.S3_REGION,
  forcePathStyle: env.S3_FORCE_PATH_STYLE,
  credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
});
let ctx: { submissionId: string; roundId: string; runId: string; userId: string };

const stream = (bytes: Uint8Array | string, chunk = 13) =>
  new ReadableStream<Uint8Array>({
    start(c) {
      const b = typeof bytes === "string" ? new TextEncoder().encode(bytes) : bytes;
      for (let i = 0; i < b.length; i += chunk) c.enqueue(b.slice(i, i + chunk));
      c.close();
    },
  });

// 40 rows (fewer than the plot's 600 points, so the plot copy holds every value as read).
const n = 40;
const t = Array.from({ length: n }, (_, i) => i * 0.125);
const ekin = t.map((x) => 1500 + 20 * Math.sin(3 * x));
const rm = t.map((x) => 300 + 5 * Math.cos(2 * x));

async function hdf5(write: (f: InstanceType<typeof h5wasm.File>) => void): Promise<Uint8Array> {
  const { FS } = await h5wasm.ready;
  const name = `/upload-${Math.random().toString(36).slice(2)}.h5`;
  const f = new h5wasm.File(name, "w");
  write(f);
  f.flush();
  f.close();
  const bytes = FS.readFile(name) as Uint8Array;
  FS.unlink(name);
  return bytes;
}

async function objectsOfRound() {
  const out = await s3.send(new ListObjectsV2Command({ Bucket: env.S3_BUCKET, Prefix: `attachments/${ctx.roundId}/` }));
  return out.Contents?.length ?? 0;
}
const rowsOfRound = () => db.select().from(attachments).innerJoin(storedFiles, eq(storedFiles.id, attachments.fileId)).where(like(storedFiles.key, `attachments/${ctx.roundId}/%`));

beforeAll(async () => {
  const [author] = await db.select({ id: user.id }).from(user).where(eq(user.email, "author@demo.runproof.example"));
  const [venue] = await db.select({ id: venues.id }).from(venues).where(eq(venues.slug, "corvane-annals"));
  const created = await createSubmission(db, {
    venueId: venue!.id,
    userId: author!.id,
    fields: { title: `series formats test ${Date.now()}`, abstract: "", keywords: [], availability: "", dois: [] },
  });
  const [round] = await db.select({ id: rounds.id }).from(rounds).where(eq(rounds.submissionId, created.submissionId));
  const { run } = await addRun(db, {
    submissionId: created.submissionId,
    roundId: round!.id,
    origin: "form",
    userId: author!.id,
    input: {
      format: "runproof.run/1",
      label: "formats-run",
      geometry: { radiusRatio: 0.35 },
      conventions: { lengthScale: "gap", timeScale: "viscous", rotationFactor: 1, rayleigh: "classical" },
      controls: { E: 1e-4, Ra: 1e7, Pr: 1, Pm: 2 },
      time: { start: 0, end: t[n - 1]! },
    },
  });
  ctx = { submissionId: created.submissionId, roundId: round!.id, runId: run.id, userId: author!.id };
});

afterAll(async () => {
  if (ctx) await db.delete(submissions).where(eq(submissions.id, ctx.submissionId));
  await sql.end({ timeout: 5 });
});

const opts = (filename: string, format: "columns" | "hdf5" | "netcdf", map: string | null) => ({
  roundId: ctx.roundId,
  runId: ctx.runId,
  kind: "series" as const,
  filename,
  userId: ctx.userId,
  limitBytes: 1_000_000,
  format,
  map,
});

/** Uploads, runs the check job's pass, and returns the stored attachment. */
async function uploadAndAnalyse(body: Uint8Array | string, o: ReturnType<typeof opts>) {
  const out = await attachCsv(db, { ...o, body: stream(body) });
  await recheckRound(db, ctx.roundId);
  const [row] = await db.select().from(attachments).where(eq(attachments.id, out.attachmentId));
  return { out, row: row! };
}

function expectValues(row: typeof attachments.$inferSelect, cols: Record<string, number[]>) {
  for (const [name, values] of Object.entries(cols)) {
    const pts = row.plot!.points[name]!;
    expect(pts.map((p) => p.x)).toEqual(t);
    pts.forEach((p, i) => expect(p.y).toBeCloseTo(values[i]!, 9));
  }
}

describe("series uploads in the formats codes write", () => {
  it("reads whitespace-separated columns with comments and Fortran D exponents through the column map", async () => {
    // Fortran list output: `!` and `#` comments, D exponents (ISO/IEC 1539 Dw.d), a skipped column.
    const lines = ["! time  step  ekin  rm", "# written by an invented code"];
    t.forEach((x, i) => lines.push(`  ${x.toExponential(8).replace("e", "D")}   ${i + 1}   ${ekin[i]!.toExponential(12).replace("e", "D")}  ${rm[i]!.toExponential(12).replace("e", "d")}  ! step ${i + 1}`));
    const { out, row } = await uploadAndAnalyse(lines.join("\n") + "\n", opts("series.dat", "columns", "t,-,kineticEnergy,Rm"));
    expect(out).toMatchObject({ rowCount: n, columns: ["t", "kineticEnergy", "Rm"] });
    expect(row).toMatchObject({ format: "columns", sourceMap: "t,-,kineticEnergy,Rm" });
    expectValues(row, { kineticEnergy: ekin, Rm: rm });
    expect(row.analysis).toMatchObject({ kind: "series", stats: { rows: n, tStart: 0, tEnd: t[n - 1] } });
    // The statistics' mean over the window after the transient, against simple-statistics' mean of the same rows.
    const stats = (row.analysis as { stats: { columns: Record<string, { mean: number; truncationIndex: number }> } }).stats.columns.Rm!;
    expect(stats.mean).toBeCloseTo(mean(rm.slice(stats.truncationIndex)), 9);
  });

  it("reads an HDF5 file written by h5wasm through the dataset map", async () => {
    const bytes = await hdf5((f) => {
      f.create_dataset({ name: "time", data: new Float64Array(t) });
      f.create_group("diag");
      const g = f.get("diag") as InstanceType<typeof h5wasm.Group>;
      g.create_dataset({ name: "ekin", data: new Float64Array(ekin) });
      g.create_dataset({ name: "rm", data: new Float64Array(rm) });
    });
    const { row } = await uploadAndAnalyse(bytes, opts("series.h5", "hdf5", "t:time,kineticEnergy:diag/ekin,Rm:diag/rm"));
    expect(row).toMatchObject({ format: "hdf5", columns: ["t", "kineticEnergy", "Rm"], rowCount: n });
    expectValues(row, { kineticEnergy: ekin, Rm: rm });
  });

  it("reads a NetCDF classic file written from the format specification", async () => {
    const bytes = netcdf({ time: t, ekin, rm });
    expect(String.fromCharCode(...bytes.slice(0, 3))).toBe("CDF"); // magic of the classic format (Unidata specification)
    const { row } = await uploadAndAnalyse(bytes, opts("series.nc", "netcdf", "t:time,kineticEnergy:ekin,Rm:rm"));
    expect(row).toMatchObject({ format: "netcdf", columns: ["t", "kineticEnergy", "Rm"], rowCount: n });
    expectValues(row, { kineticEnergy: ekin, Rm: rm });
  });

  it("refuses a bad file of each format with what, where and how to fix, and stores nothing", async () => {
    const rowsBefore = (await rowsOfRound()).length;
    const objectsBefore = await objectsOfRound();
    const bad: Array<[Uint8Array | string, ReturnType<typeof opts>, RegExp, RegExp]> = [
      // a letter where a number belongs, on line 3
      ["0 1\n0.1 2\n0.2 x\n", opts("bad.dat", "columns", "t,kineticEnergy"), /line 3/, /kineticEnergy.*not a number/],
      // no map for a file without a header
      ["0 1\n0.1 2\n", opts("nomap.dat", "columns", null), /column map/, /no header/],
      // a dataset the file does not hold: the message lists what it does hold
      [netcdf({ time: t, ekin }), opts("missing.nc", "netcdf", "t:time,Rm:rm"), /file/, /"rm".*not a variable.*time, ekin/],
      // not an HDF5 file at all
      ["t,kineticEnergy\n0,1\n", opts("fake.h5", "hdf5", "t,kineticEnergy"), /file/, /not HDF5/],
    ];
    for (const [body, o, path, message] of bad) {
      const err = await attachCsv(db, { ...o, body: stream(body) }).catch((e) => e);
      expect(err, o.filename).toBeInstanceOf(InvalidInput);
      expect((err as InvalidInput).message, o.filename).toContain("nothing was stored");
      expect((err as InvalidInput).issues[0]!.path, o.filename).toMatch(path);
      expect((err as InvalidInput).issues[0]!.message, o.filename).toMatch(message);
    }
    expect(await rowsOfRound()).toHaveLength(rowsBefore);
    expect(await objectsOfRound()).toBe(objectsBefore);
  });
});
