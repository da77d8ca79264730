import { Readable } from "node:stream";
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { CsvFormatError, parseSeriesCsv, parseSpectrumCsv } from "../../app/checker/csv.ts";
import { parseCsvStream } from "../../app/checker/csv-stream.ts";

describe("CSV attachments (RFC 4180)", () => {
  it("parses a series into columns", () => {
    const c = parseSeriesCsv("t,Re,Rm\n0,1,2\n0.5,1.5,3\r\n1,2,4\n");
    expect(c).toEqual({ t: [0, 0.5, 1], Re: [1, 1.5, 2], Rm: [2, 3, 4] });
  });
  it("accepts quoted header fields (RFC 4180)", () => {
    expect(parseSeriesCsv('"t","Re"\n0,1\n1,2').Re).toEqual([1, 2]);
  });
  it("reports a non-number with its line number", () => {
    const rows = ["t,Re", ...Array.from({ length: 15 }, (_, i) => `${i},${i}`), "15,abc"];
    expect(() => parseSeriesCsv(rows.join("\n"))).toThrow("line 17: column Re is not a number ('abc')");
  });
  it("requires t (series) or l (spectrum) first", () => {
    expect(() => parseSeriesCsv("time,Re\n0,1\n1,2")).toThrow(/line 1: the first column of a series must be "t"/);
    expect(() => parseSpectrumCsv("t,kinetic\n1,2\n2,1")).toThrow(/must be "l"/);
    expect(() => parseSpectrumCsv("l,thermal\n1,2\n2,1")).toThrow(/not allowed/);
  });
  it("reports ragged rows, decreasing time and too few rows", () => {
    expect(() => parseSeriesCsv("t,Re\n0,1\n1,2,3")).toThrow(CsvFormatError);
    expect(() => parseSeriesCsv("t,Re\n0,1\n2,2\n1,3")).toThrow(/line 4: column t must increase/);
    expect(() => parseSeriesCsv("t,Re\n0,1")).toThrow(/at least 2/);
    expect(() => parseSpectrumCsv("l,kinetic\n1.5,1\n2,1")).toThrow(/integer degrees/);
  });
  it("streaming gives the same columns as the whole text, in small chunks", async () => {
    const text = readFileSync("examples/series/ref-A.csv", "utf8");
    const chunks = text.match(/[\s\S]{1,37}/g) ?? [];
    const streamed = await parseCsvStream(Readable.from(chunks), "series");
    expect(streamed).toEqual(parseSeriesCsv(text));
    expect(streamed.t?.length).toBe(301);
  });
  it("streaming reports the line of a bad cell", async () => {
    await expect(parseCsvStream(["t,Re\n0,1\n", "1,x\n"], "series")).rejects.toThrow("line 3: column Re is not a number ('x')");
  });
});
