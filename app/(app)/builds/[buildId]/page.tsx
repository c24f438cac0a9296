import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { BenchTestSection } from "@/components/builds/bench-test-section";
import { BuildHistory } from "@/components/builds/build-history";
import { SheetCheckPanel } from "@/components/builds/sheet-check-panel";
import { TrendChart } from "@/components/builds/trend-chart";
import { VerdictBadge } from "@/components/runs/verdict-badge";
import { SafetyNote } from "@/components/ui/safety-note";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { loadBuildView, type BuildView } from "@/lib/builds/build-view";
import { FUNCTION_WORDS } from "@/lib/builds/sheet-check";
import { NotFoundError } from "@/lib/errors";
import { formatSpan } from "@/lib/format/units";
import { idSchema } from "@/lib/validations/crew";
import { BuildDetailsForm } from "./build-details-form";
import { LinkSheetEditor } from "./link-sheet-editor";
import { DeletePhotoButton, PhotoUploader } from "./photo-uploader";
import { RetireButton } from "./retire-button";

export const metadata: Metadata = { title: "Build" };

async function load(raw: string): Promise<BuildView> {
  const id = idSchema.safeParse(raw);
  if (!id.success) notFound();
  const { actor } = await getCrewPageContext();
  try {
    return await loadBuildView(actor, id.data);
  } catch (e) {
    if (e instanceof NotFoundError) notFound();
    throw e;
  }
}

const vehicleLabel = { ground: "Ground rover", multirotor: "Multirotor", "fixed-wing": "Fixed-wing plane", boat: "Boat" } as const;
const actionLabel = { "return-to-home": "Return to home", hold: "Hold position", land: "Land" } as const;
const utcDay = (d: Date) => d.toISOString().slice(0, 10);
const fig = (v: number | null, unit: string) => (v == null ? "—" : `${Number(v.toPrecision(7))} ${unit}`);

function Section({ id, title, children, lead }: { id: string; title: string; lead?: string; children: React.ReactNode }) {
  return (
    <section className="panel mt-6" aria-labelledby={id}>
      <h2 id={id} className="text-lg font-semibold">
        {title}
      </h2>
      {lead && <p className="mt-1 max-w-prose text-sm text-ink-soft">{lead}</p>}
      <div className="mt-4">{children}</div>
    </section>
  );
}

export default async function BuildPage({ params }: { params: Promise<{ buildId: string }> }) {
  const v = await load((await params).buildId);
  const { build: b, mayEdit, check, trends } = v;
  const retired = b.retiredAt !== null;
  const radio = [b.receiver, b.bandMhz != null && `${Number(b.bandMhz.toPrecision(7))} MHz`, b.txPowerMw != null && `${Number(b.txPowerMw.toPrecision(7))} mW`].filter(Boolean).join(" · ");
  const used = b.channels.filter((c) => c.function !== "unused");

  return (
    <>
      <header className="mb-4 flex flex-col gap-3 border-b border-rule pb-4 sm:flex-row sm:items-end sm:justify-between">
        <div className="min-w-0">
          <p className="text-sm text-ink-soft">
            <Link href="/builds" className="text-tide-700 underline">
              Builds
            </Link>{" "}
            / {vehicleLabel[b.vehicleType]}
          </p>
          <h1 className="text-2xl font-bold tracking-tight break-words">{b.name}</h1>
          {radio && <p className="mt-1 text-ink-soft">{radio}</p>}
        </div>
        <div className="flex flex-wrap gap-2">
          <Link href={`/builds/${b.id}/checklist`} className="btn-quiet">
            Pre-run checklist
          </Link>
          {mayEdit && <RetireButton buildId={b.id} retired={retired} />}
        </div>
      </header>

      {retired && (
        <p role="status" className="mb-4 rounded-md border-l-4 border-watch bg-watch/10 px-4 py-3 text-sm" data-testid="retired-banner">
          Retired on {utcDay(b.retiredAt!)}. Its runs stay here; it is no longer offered for new uploads.
        </p>
      )}

      <Section id="check" title="Sheet check" lead="Common setup mistakes, read from the link sheet, the failsafe plan and the build's logs.">
        <SheetCheckPanel check={check} />
      </Section>

      <Section
        id="link-sheet"
        title="Link sheet and failsafe plan"
        lead="Which channel does what, where each function engages, and what the receiver sends on each channel when the link is lost."
      >
        {mayEdit ? (
          <LinkSheetEditor buildId={b.id} channels={b.channels} failsafeAction={b.failsafeAction} failsafeWithinS={b.failsafeWithinS} />
        ) : (
          <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_15rem]">
            {used.length === 0 ? (
              <p className="text-sm text-ink-soft">No channels recorded yet; a crew lead fills in the link sheet.</p>
            ) : (
              <div className="overflow-x-auto">
                <table className="w-full text-left text-sm">
                  <thead className="border-b border-rule text-ink-soft">
                    <tr>
                      <th className="py-1 pr-3 font-medium">Channel</th>
                      <th className="py-1 pr-3 font-medium">Function</th>
                      <th className="py-1 pr-3 font-medium">Switch</th>
                      <th className="py-1 pr-3 font-medium">Engages (µs)</th>
                      <th className="py-1 pr-3 font-medium">On link loss (µs)</th>
                    </tr>
                  </thead>
                  <tbody className="figures">
                    {used.map((c) => (
                      <tr key={c.channel} className="border-b border-rule/60">
                        <td className="py-1 pr-3">{c.channel}</td>
                        <td className="py-1 pr-3 font-sans">{FUNCTION_WORDS[c.function]}</td>
                        <td className="py-1 pr-3 font-sans">{[c.switchLabel, c.positions && `${c.positions} positions`].filter(Boolean).join(", ") || "—"}</td>
                        <td className="py-1 pr-3">{c.engageMinUs != null && c.engageMaxUs != null ? `${c.engageMinUs}–${c.engageMaxUs}` : "—"}</td>
                        <td className="py-1 pr-3">{c.failsafeUs ?? "—"}</td>
                      </tr>
                    ))}
                  </tbody>
                </table>
              </div>
            )}
            <div className="rounded-md border border-rule bg-paper p-4 text-sm">
              <p className="font-semibold">Failsafe plan</p>
              <p className="mt-1">{b.failsafeAction ? actionLabel[b.failsafeAction] : "Not set"}</p>
              <p className="text-ink-soft">{b.failsafeWithinS != null ? `within ${formatSpan(b.failsafeWithinS)}` : "No expected time"}</p>
            </div>
          </div>
        )}
        <div className="mt-4">
          <SafetyNote topic="failsafe" />
        </div>
      </Section>

      <Section
        id="bench-test"
        title="Failsafe bench test"
        lead="The latest bench test of this build's failsafe, recorded by a lead from a bench log's debrief. A link-sheet change after it makes it stale."
      >
        <BenchTestSection vehicleType={b.vehicleType} latest={v.benchTests.latest} earlier={v.benchTests.earlier} linkSheetChangedAt={b.linkSheetChangedAt} />
      </Section>

      <Section id="runs" title="Runs with this build" lead="Each run's figures over time; dashed lines mark when the build record changed.">
        {v.runs.length === 0 ? (
          <p className="text-sm text-ink-soft">
            No runs yet. Choose this build when you{" "}
            <Link href="/runs/upload" className="text-tide-700 underline">
              upload a log
            </Link>
            .
          </p>
        ) : (
          <>
            <div className="grid gap-6 md:grid-cols-2" data-testid="trend-charts">
              {trends.metrics.map((m) => (
                <TrendChart key={m.key} testId={`trend-${m.key}`} label={m.label} unit={m.unit} points={m.points} markers={trends.markers} note={m.note} />
              ))}
            </div>
            {trends.markers.length > 0 && (
              <details className="mt-3 text-sm">
                <summary className="cursor-pointer text-tide-700">When the build changed ({trends.markers.length})</summary>
                <ul className="mt-1 grid gap-0.5">
                  {trends.markers.map((m, i) => (
                    <li key={i}>
                      <span className="figures">{new Date(m.t * 1000).toISOString().replace("T", " ").slice(0, 16)} UTC</span> — {m.label}
                    </li>
                  ))}
                </ul>
              </details>
            )}
            <div className="mt-4 overflow-x-auto">
              <table className="w-full text-left text-sm" data-testid="build-runs">
                <thead className="border-b border-rule text-ink-soft">
                  <tr>
                    <th className="py-1 pr-3 font-medium">Run</th>
                    <th className="py-1 pr-3 font-medium">Date</th>
                    <th className="py-1 pr-3 font-medium">Pilot</th>
                    <th className="py-1 pr-3 font-medium">Verdict</th>
                  </tr>
                </thead>
                <tbody>
                  {[...v.runs].reverse().map((r) => (
                    <tr key={r.id} className="border-b border-rule/60">
                      <td className="py-1.5 pr-3">
                        <Link href={`/runs/${r.id}`} className="text-tide-700 underline break-all">
                          {r.title}
                        </Link>
                      </td>
                      <td className="figures py-1.5 pr-3">{utcDay(r.startedAt ?? r.createdAt)}</td>
                      <td className="py-1.5 pr-3">{r.pilotName ?? "—"}</td>
                      <td className="py-1.5 pr-3">{r.status === "ready" ? <VerdictBadge level={r.verdict} /> : <span className="text-ink-soft">{r.status}</span>}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
            <div className="mt-4">
              <SafetyNote topic="range" />
            </div>
          </>
        )}
      </Section>

      <Section id="details" title="Build details">
        {mayEdit ? (
          <BuildDetailsForm
            buildId={b.id}
            values={{
              name: b.name,
              vehicleType: b.vehicleType,
              frame: b.frame,
              flightController: b.flightController,
              firmware: b.firmware,
              firmwareVersion: b.firmwareVersion,
              receiver: b.receiver,
              transmitter: b.transmitter,
              bandMhz: b.bandMhz,
              txPowerMw: b.txPowerMw,
              rxSensitivityDbm: b.rxSensitivityDbm,
              antennas: b.antennas,
              batteryCells: b.batteryCells,
              batteryCapacityMah: b.batteryCapacityMah,
              notes: b.notes,
            }}
          />
        ) : (
          <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-2">
            {(
              [
                ["Vehicle type", vehicleLabel[b.vehicleType]],
                ["Frame", b.frame],
                ["Flight controller board", b.flightController],
                ["Firmware", [b.firmware, b.firmwareVersion].filter(Boolean).join(" ")],
                ["Receiver", b.receiver],
                ["Transmitter", b.transmitter],
                ["Link band", fig(b.bandMhz, "MHz")],
                ["Transmitter power", fig(b.txPowerMw, "mW")],
                ["Receiver sensitivity", fig(b.rxSensitivityDbm, "dBm")],
                ["Antennas", b.antennas],
                ["Battery", [b.batteryCells && `${b.batteryCells}S`, b.batteryCapacityMah && `${b.batteryCapacityMah} mAh`].filter(Boolean).join(", ")],
                ["Notes", b.notes],
              ] as const
            ).map(([k, val]) => (
              <div key={k}>
                <dt className="text-ink-soft">{k}</dt>
                <dd className="whitespace-pre-line">{val || "—"}</dd>
              </div>
            ))}
          </dl>
        )}
      </Section>

      <Section id="photos" title="Photos">
        {v.photos.length === 0 ? (
          <p className="text-sm text-ink-soft">No photos yet.</p>
        ) : (
          <ul className="grid grid-cols-2 gap-3 sm:grid-cols-3 lg:grid-cols-4" data-testid="build-photos">
            {v.photos.map((p) => (
              <li key={p.id} className="min-w-0">
                {/* Presigned, short-lived URLs from the object store: not for the image optimiser. */}
                <img src={p.url} alt={p.caption ?? `Photo of ${b.name}`} className="aspect-[4/3] w-full rounded-md border border-rule object-cover" loading="lazy" />
                <div className="mt-1 flex items-start justify-between gap-2 text-sm">
                  <span className="min-w-0 break-words">{p.caption ?? p.fileName}</span>
                  {mayEdit && <DeletePhotoButton buildId={b.id} photoId={p.id} name={p.fileName} />}
                </div>
              </li>
            ))}
          </ul>
        )}
        {mayEdit && <PhotoUploader buildId={b.id} />}
      </Section>

      <Section id="history" title="History" lead="Every change to the record, the link sheet and the photos, with who made it.">
        <BuildHistory entries={v.history} />
      </Section>
    </>
  );
}
