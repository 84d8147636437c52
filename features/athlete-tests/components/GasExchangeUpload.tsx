"use client";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useEffect, useRef, useState, type DragEvent } from "react";
import { useForm, useWatch } from "react-hook-form";
import { z } from "zod";
import {
  CHANNEL_LABELS,
  CHANNELS,
  guessColumns,
  REQUIRED_CHANNELS,
  UNIT_CHOICES,
  type Channel,
  type ColumnMapping,
  type UnitChoices,
} from "@/features/gas-exchange/lib/csv";
import { fileKind, readGasExchangeFile, REFUSED_KINDS } from "@/features/gas-exchange/lib/workbook";
import { parseTime } from "@/features/gas-exchange/lib/csv";
import { FieldError, FormAlert } from "@/features/platform/components/form-bits";
import { ApiError } from "@/features/platform/lib/api-client";
import { uploadGasExchange } from "../api";
import { MAX_UPLOAD_BYTES, testMetaSchema } from "../schemas";
import { MetaFields } from "./MetaFields";
import { SubmitButton } from "@/features/platform/components/SubmitButton";

const formSchema = z.object({
  meta: testMetaSchema,
  bodyMassKg: z
    .number({ error: "Enter body mass in kg." })
    .gt(20, "Body mass must be above 20 kg.")
    .lt(300, "Body mass must be below 300 kg.")
    .nullable(),
  fiveZones: z.boolean(),
});
type FormValues = z.infer<typeof formSchema>;

interface Picked {
  file: File;
  headers: string[];
  mapping: ColumnMapping;
  chosenUnits: UnitChoices;
  sheets: string[];
  sheet: string | null;
  rows: number;
  units: Partial<Record<Channel, string>>;
  problem: string | null;
  warnings: string[];
}

async function inspect(
  file: File,
  bytes: Uint8Array,
  mapping: ColumnMapping | undefined,
  chosenUnits: UnitChoices,
  sheet: string | null,
  massKg: number | null,
): Promise<Picked> {
  const result = await readGasExchangeFile(bytes, mapping, { units: chosenUnits, sheet, bodyMassKg: massKg });
  const sheets = result.sheets ?? [];
  const base = { file, chosenUnits, sheets, sheet: result.sheet ?? sheet };
  if (!result.ok) {
    const firstLine =
      fileKind(bytes) === "csv"
        ? (new TextDecoder()
            .decode(bytes.subarray(0, 4096))
            .replace(/^\uFEFF/, "")
            .split(/\r?\n/, 1)[0] ?? "")
        : "";
    const headers = result.headers.length
      ? result.headers
      : firstLine
          .split(/[;,\t]/)
          .map((h) => h.trim())
          .filter(Boolean);
    return {
      ...base,
      headers,
      mapping: mapping ?? guessColumns(headers),
      rows: 0,
      units: {},
      problem: result.error,
      warnings: [],
    };
  }
  const picked: ColumnMapping = {};
  const units: Partial<Record<Channel, string>> = {};
  for (const c of CHANNELS) {
    const col = result.columns[c];
    if (col) {
      picked[c] = col.header;
      units[c] =
        `${col.unit}${col.unitReason === "values" ? " (from the values)" : col.unitReason === "header" ? " (from the header)" : col.unitReason === "chosen" ? " (as chosen)" : ""}`;
    }
  }
  return {
    ...base,
    headers: result.headers,
    mapping: picked,
    rows: result.breaths.length,
    units,
    problem: null,
    warnings: result.warnings,
  };
}

const UNIT_CHANNELS = Object.keys(UNIT_CHOICES) as (keyof typeof UNIT_CHOICES)[];

/** Seconds from "90", "1:30" or "01:01:30"; null when empty; NaN when unreadable. */
function segmentTime(v: string): number | null {
  return v.trim() === "" ? null : parseTime(v);
}

export function GasExchangeUpload({
  athleteId,
  defaultMassKg,
  today,
}: {
  athleteId: string;
  defaultMassKg: number | null;
  today: string;
}) {
  const router = useRouter();
  const [picked, setPicked] = useState<Picked | null>(null);
  const [bytes, setBytes] = useState<Uint8Array>(new Uint8Array());
  const [segmentFrom, setSegmentFrom] = useState("");
  const [segmentTo, setSegmentTo] = useState("");
  const [fileError, setFileError] = useState<string>();
  const [progress, setProgress] = useState<number | null>(null);
  const [dragging, setDragging] = useState(false);
  const { register, control, handleSubmit, formState, setError, getValues } = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: {
      meta: { sport: "cycling", protocol: "", date: today, endedBy: "exhaustion", stopSign: null },
      bodyMassKg: defaultMassKg,
      fiveZones: false,
    },
  });

  // A relative-only VO2 column needs the body mass: read the file again when the mass changes, so that entering it
  // clears the problem instead of leaving the button disabled.
  const watchedMass = useWatch({ control, name: "bodyMassKg" });
  const triedMass = useRef<number | null>(null);
  useEffect(() => {
    if (!picked?.problem || !/body mass/.test(picked.problem)) return;
    const m =
      typeof watchedMass === "number" && Number.isFinite(watchedMass) && watchedMass > 20 && watchedMass < 300
        ? watchedMass
        : null;
    if (m === null || m === triedMass.current) return;
    triedMass.current = m;
    let live = true;
    void inspect(picked.file, bytes, picked.mapping, picked.chosenUnits, picked.sheet, m).then(
      (next) => live && setPicked(next),
    );
    return () => {
      live = false;
    };
  }, [watchedMass, picked, bytes]);

  const massNow = () => {
    const m = getValues("bodyMassKg");
    return typeof m === "number" && Number.isFinite(m) ? m : null;
  };
  const fromS = segmentTime(segmentFrom),
    toS = segmentTime(segmentTo);
  const segmentProblem =
    (fromS !== null && !Number.isFinite(fromS)) || (toS !== null && !Number.isFinite(toS))
      ? "Give the segment's start and end as seconds or mm:ss."
      : fromS !== null && toS !== null && toS <= fromS + 60
        ? "The test segment must end at least a minute after it starts."
        : null;

  async function choose(file: File | undefined) {
    setFileError(undefined);
    setPicked(null);
    if (!file) return;
    if (file.size > MAX_UPLOAD_BYTES)
      return setFileError("The file is larger than 10 MB. Export a shorter file or averaged data.");
    if (file.size === 0) return setFileError("The file is empty.");
    const b = new Uint8Array(await file.arrayBuffer());
    const kind = fileKind(b);
    if (kind === "xls" || kind === "binary") return setFileError(REFUSED_KINDS[kind]);
    setBytes(b);
    setPicked(await inspect(file, b, undefined, {}, null, massNow()));
  }

  async function remap(channel: Channel, header: string) {
    if (!picked) return;
    const mapping: ColumnMapping = { ...picked.mapping };
    if (header) mapping[channel] = header;
    else delete mapping[channel];
    const next = await inspect(picked.file, bytes, mapping, picked.chosenUnits, picked.sheet, massNow());
    setPicked({ ...next, mapping });
  }

  async function setUnit(channel: keyof typeof UNIT_CHOICES, unit: string) {
    if (!picked) return;
    const chosenUnits = { ...picked.chosenUnits, [channel]: unit || undefined } as UnitChoices;
    if (!unit) delete (chosenUnits as Record<string, unknown>)[channel];
    setPicked(await inspect(picked.file, bytes, picked.mapping, chosenUnits, picked.sheet, massNow()));
  }

  async function setSheet(sheet: string) {
    if (!picked) return;
    setPicked(await inspect(picked.file, bytes, undefined, picked.chosenUnits, sheet, massNow()));
  }

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    void choose(e.dataTransfer.files[0]);
  };

  const onSubmit = handleSubmit(async (values) => {
    if (!picked || picked.problem || segmentProblem) return;
    const form = new FormData();
    form.set("file", picked.file);
    form.set("sport", values.meta.sport);
    form.set("protocol", values.meta.protocol);
    form.set("date", values.meta.date);
    form.set("endedBy", values.meta.endedBy);
    if (values.meta.stopSign) form.set("stopSign", values.meta.stopSign);
    form.set("mapping", JSON.stringify(picked.mapping));
    if (Object.keys(picked.chosenUnits).length) form.set("units", JSON.stringify(picked.chosenUnits));
    if (picked.sheet) form.set("sheet", picked.sheet);
    if (fromS !== null || toS !== null) form.set("segment", JSON.stringify({ fromS, toS }));
    if (values.bodyMassKg !== null) form.set("bodyMassKg", String(values.bodyMassKg));
    form.set("fiveZones", String(values.fiveZones));
    setProgress(0);
    try {
      const { id } = await uploadGasExchange(athleteId, form, setProgress);
      setProgress(1);
      router.push(`/tests/${id}`);
    } catch (e) {
      setProgress(null);
      const fields =
        e instanceof ApiError
          ? Object.entries(e.fieldErrors)
              .map(([k, v]) => `${k}: ${v[0]}`)
              .join("; ")
          : "";
      setError("root", {
        message: `${e instanceof ApiError ? e.message : "The upload failed."}${fields ? ` (${fields})` : ""}`,
      });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6">
      <FormAlert>{formState.errors.root?.message}</FormAlert>
      <section aria-labelledby="file-heading" className="space-y-3">
        <h2 id="file-heading" className="text-lg font-bold">
          1. The test file
        </h2>
        <label
          htmlFor="gas-file"
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={`flex cursor-pointer flex-col items-center justify-center rounded-lg border-2 border-dashed p-8 text-center ${dragging ? "border-tide bg-tide-wash" : "border-rule bg-paper"}`}
        >
          <span className="font-semibold">
            Drop a breath-by-breath or averaged export here (CSV or .xlsx), or choose a file
          </span>
          <span className="mt-1 text-sm text-ink-soft">
            Time, VO2, VCO2 and VE are needed; heart rate, power, speed, grade and breathing frequency are used when
            present. Up to 10 MB.
          </span>
          <span className="btn-quiet mt-3">Choose a file</span>
        </label>
        <input
          id="gas-file"
          type="file"
          accept=".csv,.txt,.xlsx,text/csv,text/plain,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
          className="sr-only"
          onChange={(e) => void choose(e.target.files?.[0])}
        />
        <FieldError id="gas-file-error" message={fileError} />
      </section>

      {picked ? (
        <section aria-labelledby="mapping-heading" className="space-y-3">
          <h2 id="mapping-heading" className="text-lg font-bold">
            2. Check the columns
          </h2>
          <p className="text-sm text-ink-soft">
            {picked.file.name}: {picked.problem ? "the columns need your help." : `${picked.rows} rows read.`} Tidemark
            guessed each column from its header; correct any that are wrong.
          </p>
          <table className="w-full text-left text-sm">
            <thead>
              <tr className="border-b border-rule text-ink-soft">
                <th scope="col" className="py-1 pr-3">
                  Measure
                </th>
                <th scope="col" className="py-1 pr-3">
                  Column in the file
                </th>
                <th scope="col" className="py-1 pr-3">
                  Unit read
                </th>
              </tr>
            </thead>
            <tbody>
              {CHANNELS.map((c) => (
                <tr key={c} className="border-b border-rule/60">
                  <th scope="row" className="py-1 pr-3 font-semibold">
                    {CHANNEL_LABELS[c]}
                    {REQUIRED_CHANNELS.includes(c) ? <span className="text-alert"> (required)</span> : null}
                  </th>
                  <td className="py-1 pr-3">
                    <select
                      aria-label={`Column for ${CHANNEL_LABELS[c]}`}
                      className="field-input mt-0"
                      value={picked.mapping[c] ?? ""}
                      onChange={(e) => void remap(c, e.target.value)}
                    >
                      <option value="">— not in the file —</option>
                      {picked.headers.map((h) => (
                        <option key={h} value={h}>
                          {h}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="py-1 pr-3 text-ink-soft">
                    {picked.units[c] ?? "—"}
                    {(UNIT_CHANNELS as string[]).includes(c) && picked.mapping[c] ? (
                      <select
                        aria-label={`Unit of ${CHANNEL_LABELS[c]}`}
                        className="field-input mt-1"
                        value={picked.chosenUnits[c as keyof UnitChoices] ?? ""}
                        onChange={(e) => void setUnit(c as keyof typeof UNIT_CHOICES, e.target.value)}
                      >
                        <option value="">as read</option>
                        {UNIT_CHOICES[c as keyof typeof UNIT_CHOICES].map((u) => (
                          <option key={u} value={u}>
                            {u}
                          </option>
                        ))}
                      </select>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          {picked.sheets.length > 1 ? (
            <div>
              <label htmlFor="gas-sheet" className="field-label">
                Sheet of the workbook
              </label>
              <select
                id="gas-sheet"
                className="field-input"
                value={picked.sheet ?? ""}
                onChange={(e) => void setSheet(e.target.value)}
              >
                {picked.sheets.map((n) => (
                  <option key={n} value={n}>
                    {n}
                  </option>
                ))}
              </select>
            </div>
          ) : null}
          <fieldset className="grid gap-4 sm:grid-cols-2">
            <legend className="field-label">
              Test segment{" "}
              <span className="font-normal text-ink-soft">
                (optional: Tidemark finds the ramp itself; set a start or end only to correct it)
              </span>
            </legend>
            <div>
              <label htmlFor="segment-from" className="field-label">
                Starts at <span className="font-normal text-ink-soft">(s or mm:ss)</span>
              </label>
              <input
                id="segment-from"
                className="field-input num"
                value={segmentFrom}
                onChange={(e) => setSegmentFrom(e.target.value)}
                placeholder="found from the workload"
              />
            </div>
            <div>
              <label htmlFor="segment-to" className="field-label">
                Ends at <span className="font-normal text-ink-soft">(s or mm:ss)</span>
              </label>
              <input
                id="segment-to"
                className="field-input num"
                value={segmentTo}
                onChange={(e) => setSegmentTo(e.target.value)}
                placeholder="found from the workload"
              />
            </div>
          </fieldset>
          {segmentProblem ? <FormAlert>{segmentProblem}</FormAlert> : null}
          {picked.problem ? <FormAlert>{picked.problem}</FormAlert> : null}
          {picked.warnings.length ? (
            <ul className="list-disc pl-5 text-sm text-ink-soft">
              {picked.warnings.slice(0, 6).map((w) => (
                <li key={w}>{w}</li>
              ))}
            </ul>
          ) : null}
        </section>
      ) : null}

      <section aria-labelledby="about-heading" className="space-y-3">
        <h2 id="about-heading" className="text-lg font-bold">
          {picked ? "3." : "2."} About the test
        </h2>
        <MetaFields
          register={register}
          errors={formState.errors}
          endedBy={useWatch({ control, name: "meta.endedBy" })}
          protocolHint="for example: cycle ergometer ramp, 25 W/min"
        />
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor="bodyMassKg" className="field-label">
              Body mass on the day <span className="font-normal text-ink-soft">(kg, for mL/kg/min)</span>
            </label>
            <input
              id="bodyMassKg"
              type="number"
              step="0.1"
              className="field-input num"
              aria-describedby="bodyMassKg-error"
              {...register("bodyMassKg", { setValueAs: (v) => (v === "" || v == null ? null : Number(v)) })}
            />
            <FieldError id="bodyMassKg-error" message={formState.errors.bodyMassKg?.message} />
          </div>
          <label className="mt-7 flex items-center gap-2 text-sm">
            <input type="checkbox" {...register("fiveZones")} /> Also show the five-zone subdivision
          </label>
        </div>
      </section>

      {progress !== null ? (
        <div>
          <label htmlFor="upload-progress" className="text-sm font-semibold">
            {progress < 1 ? "Uploading…" : "Analysing…"}
          </label>
          <progress id="upload-progress" className="block w-full" max={1} value={progress} />
        </div>
      ) : null}
      <SubmitButton
        className="btn"
        disabled={!picked || !!picked.problem || !!segmentProblem || formState.isSubmitting}
      >
        {formState.isSubmitting ? "Analysing…" : "Analyse and save the test"}
      </SubmitButton>
    </form>
  );
}
