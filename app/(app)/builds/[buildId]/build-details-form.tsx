"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { ApiFailure, parseNumber, reanalysingWords, sendJson } from "@/components/builds/api";
import { Field } from "@/components/ui/field";
import { SelectField } from "@/components/ui/select-field";

export interface DetailsValues {
  name: string;
  vehicleType: string;
  frame: string | null;
  flightController: string | null;
  firmware: string | null;
  firmwareVersion: string | null;
  receiver: string | null;
  transmitter: string | null;
  bandMhz: number | null;
  txPowerMw: number | null;
  rxSensitivityDbm: number | null;
  antennas: string | null;
  batteryCells: number | null;
  batteryCapacityMah: number | null;
  notes: string | null;
}

const textFields = ["name", "vehicleType", "frame", "flightController", "firmware", "firmwareVersion", "receiver", "transmitter", "antennas", "notes"] as const;
const numberFields = ["bandMhz", "txPowerMw", "rxSensitivityDbm", "batteryCells", "batteryCapacityMah"] as const;

/** FLOAT columns read back with noise (2.4 → 2.4000000953…): show 7 significant digits. */
const shown = (v: number | null) => (v == null ? "" : String(Number(v.toPrecision(7))));

/** Every field of the build record except the failsafe plan (edited beside the link sheet). */
export function BuildDetailsForm({ buildId, values }: { buildId: number; values: DetailsValues }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string[]>>({});
  const [message, setMessage] = useState<{ ok: boolean; text: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(form: FormData) {
    const body: Record<string, unknown> = {};
    const local: Record<string, string[]> = {};
    for (const f of textFields) body[f] = String(form.get(f) ?? "");
    for (const f of numberFields) {
      const v = parseNumber(String(form.get(f) ?? ""));
      if (Number.isNaN(v)) local[f] = ["Enter a number"];
      body[f] = v;
    }
    if (Object.keys(local).length) {
      setErrors(local);
      setMessage({ ok: false, text: "Some fields need attention" });
      return;
    }
    setBusy(true);
    setMessage(null);
    try {
      const res = await sendJson<{ changed: string[]; reanalysing: number }>(`/api/builds/${buildId}`, "PUT", body);
      setErrors({});
      const n = res.changed.length;
      setMessage({ ok: true, text: n === 0 ? "Nothing had changed." : `Saved ${n} change${n === 1 ? "" : "s"}.${reanalysingWords(res.reanalysing)}` });
      router.refresh();
    } catch (e) {
      setErrors(e instanceof ApiFailure ? e.fields : {});
      setMessage({ ok: false, text: (e as Error).message });
    } finally {
      setBusy(false);
    }
  }

  const e = errors;
  return (
    <form
      noValidate
      className="grid gap-4 sm:grid-cols-2"
      onSubmit={(ev) => {
        ev.preventDefault();
        void submit(new FormData(ev.currentTarget));
      }}
      data-testid="build-details-form"
    >
      <Field name="name" label="Name" defaultValue={values.name} errors={e.name} required maxLength={120} />
      <SelectField
        name="vehicleType"
        label="Vehicle type"
        defaultValue={values.vehicleType}
        errors={e.vehicleType}
        options={[
          { value: "ground", label: "Ground rover" },
          { value: "multirotor", label: "Multirotor" },
          { value: "fixed-wing", label: "Fixed-wing plane" },
          { value: "boat", label: "Boat" },
        ]}
      />
      <Field name="frame" label="Frame" defaultValue={values.frame ?? ""} errors={e.frame} maxLength={120} />
      <Field name="flightController" label="Flight controller board" defaultValue={values.flightController ?? ""} errors={e.flightController} maxLength={120} />
      <Field name="firmware" label="Firmware" defaultValue={values.firmware ?? ""} errors={e.firmware} maxLength={120} />
      <Field name="firmwareVersion" label="Firmware version" defaultValue={values.firmwareVersion ?? ""} errors={e.firmwareVersion} maxLength={60} />
      <Field name="receiver" label="Receiver" defaultValue={values.receiver ?? ""} errors={e.receiver} maxLength={120} />
      <Field name="transmitter" label="Transmitter" defaultValue={values.transmitter ?? ""} errors={e.transmitter} maxLength={120} />
      <Field name="bandMhz" label="Link band (MHz)" inputMode="decimal" placeholder="e.g. 868" defaultValue={shown(values.bandMhz)} errors={e.bandMhz} />
      <Field name="txPowerMw" label="Transmitter power (mW)" inputMode="decimal" placeholder="e.g. 25" defaultValue={shown(values.txPowerMw)} errors={e.txPowerMw} />
      <Field
        name="rxSensitivityDbm"
        label="Receiver sensitivity (dBm)"
        inputMode="decimal"
        placeholder="e.g. -105"
        defaultValue={shown(values.rxSensitivityDbm)}
        errors={e.rxSensitivityDbm}
      />
      <Field name="antennas" label="Antennas" defaultValue={values.antennas ?? ""} errors={e.antennas} maxLength={200} />
      <Field name="batteryCells" label="Battery cells (S)" inputMode="numeric" defaultValue={shown(values.batteryCells)} errors={e.batteryCells} />
      <Field name="batteryCapacityMah" label="Battery capacity (mAh)" inputMode="numeric" defaultValue={shown(values.batteryCapacityMah)} errors={e.batteryCapacityMah} />
      <div className="sm:col-span-2">
        <label htmlFor="f-notes" className="field-label">
          Notes
        </label>
        <textarea id="f-notes" name="notes" rows={3} className="field-input" defaultValue={values.notes ?? ""} maxLength={10_000} />
        {e.notes && <p className="field-error">{e.notes.join(" ")}</p>}
      </div>
      <div className="flex flex-wrap items-center gap-3 sm:col-span-2">
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Saving…" : "Save build details"}
        </button>
        <div role="status" aria-live="polite" className="min-h-5 text-sm">
          {message && <span className={message.ok ? "text-clear" : "text-act"}>{message.text}</span>}
        </div>
      </div>
    </form>
  );
}
