import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { SafetyNote } from "@/components/ui/safety-note";
import { getCrewPageContext } from "@/lib/auth/page-context";
import { loadChecklist } from "@/lib/builds/checklist";
import { NotFoundError } from "@/lib/errors";
import { idSchema } from "@/lib/validations/crew";
import { PrintButton } from "./print-button";

export const metadata: Metadata = { title: "Pre-run checklist" };

async function load(raw: string) {
  const id = idSchema.safeParse(raw);
  if (!id.success) notFound();
  const { actor } = await getCrewPageContext();
  try {
    return await loadChecklist(actor, id.data);
  } catch (e) {
    if (e instanceof NotFoundError) notFound();
    throw e;
  }
}

const vehicleLabel = { ground: "Ground rover", multirotor: "Multirotor", "fixed-wing": "Fixed-wing plane", boat: "Boat" } as const;

/** A box to tick on paper (and a real checkbox on screen). */
function Item({ id, children }: { id: string; children: React.ReactNode }) {
  return (
    <li className="flex gap-3 break-inside-avoid">
      <input id={id} type="checkbox" className="mt-1 size-5 shrink-0 accent-tide-700 print:appearance-none print:rounded-sm print:border-2 print:border-black" />
      <label htmlFor={id}>{children}</label>
    </li>
  );
}

function Part({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="panel mt-4 break-inside-avoid print:mt-3 print:rounded-none print:border-0 print:border-t print:border-black print:bg-white print:p-0 print:pt-2">
      <h2 className="mb-2 text-lg font-semibold print:text-base">{title}</h2>
      {children}
    </section>
  );
}

export default async function ChecklistPage({ params }: { params: Promise<{ buildId: string }> }) {
  const { build: b, check, checklist: c } = await load((await params).buildId);
  const errors = check.findings.filter((f) => f.severity === "error");
  return (
    // Printing hides the app's navigation around this page (they are siblings of #main).
    <div className="print:text-black print:[body:has(&)]:bg-white print:[body:has(&)_:has(~#main)]:hidden print:[body:has(&)_:has(>#main)]:block print:[body:has(&)_#main]:max-w-none print:[body:has(&)_#main]:p-0" data-testid="checklist">
      <div className="mb-4 flex flex-col gap-3 border-b border-rule pb-4 sm:flex-row sm:items-end sm:justify-between print:border-black print:pb-2">
        <div>
          <p className="text-sm text-ink-soft print:hidden">
            <Link href={`/builds/${b.id}`} className="text-tide-700 underline">
              {b.name}
            </Link>{" "}
            / checklist
          </p>
          <h1 className="text-2xl font-bold tracking-tight print:text-xl">Pre-run checklist: {b.name}</h1>
          <p className="mt-1 text-ink-soft print:text-black">
            {vehicleLabel[b.vehicleType]} · generated from the link sheet on {new Date().toISOString().slice(0, 10)}
          </p>
        </div>
        <PrintButton />
      </div>

      <dl className="grid grid-cols-3 gap-4 text-sm">
        {["Date", "Pilot", "Site"].map((k) => (
          <div key={k}>
            <dt className="font-medium">{k}</dt>
            <dd className="mt-4 border-b border-ink" aria-hidden="true" />
          </div>
        ))}
      </dl>

      <Part title="Sheet check">
        {errors.length === 0 ? (
          <p className="text-sm">Nothing to fix before the run{check.findings.length ? ` (${check.findings.length} to check on the build page)` : ""}.</p>
        ) : (
          <>
            <p className="text-sm font-semibold text-act print:text-black">Fix before the run:</p>
            <ul className="mt-1 list-disc pl-5 text-sm">
              {errors.map((f, i) => (
                <li key={i}>
                  {f.title} — {f.detail}
                </li>
              ))}
            </ul>
          </>
        )}
      </Part>

      <Part title="Radio and link">
        <ul className="grid gap-2 text-sm">
          {c.radio.map((t, i) => (
            <Item key={i} id={`radio-${i}`}>
              {t}
            </Item>
          ))}
          {c.sticks && <Item id="sticks">{c.sticks}</Item>}
          {c.rssi.map((t, i) => (
            <Item key={`rssi-${i}`} id={`rssi-${i}`}>
              {t}
            </Item>
          ))}
        </ul>
      </Part>

      <Part title="Switches">
        {c.switches.length === 0 ? (
          <p className="text-sm">No switch functions on the link sheet yet.</p>
        ) : (
          <table className="w-full text-left text-sm">
            <thead className="border-b border-rule print:border-black">
              <tr>
                <th className="w-8 py-1 font-medium">
                  <span className="sr-only">Checked</span>
                </th>
                <th className="py-1 pr-2 font-medium">Channel</th>
                <th className="py-1 pr-2 font-medium">Does</th>
                <th className="py-1 pr-2 font-medium">Switch</th>
                <th className="py-1 pr-2 font-medium">Engages at</th>
                <th className="py-1 pr-2 font-medium">On link loss</th>
              </tr>
            </thead>
            <tbody>
              {c.switches.map((s) => (
                <tr key={s.channel} className="border-b border-rule/60 break-inside-avoid print:border-black/40">
                  <td className="py-1.5">
                    <input type="checkbox" aria-label={`Flipped channel ${s.channel} and confirmed`} className="size-5 accent-tide-700 print:appearance-none print:rounded-sm print:border-2 print:border-black" />
                  </td>
                  <td className="figures py-1.5 pr-2">{s.channel}</td>
                  <td className="py-1.5 pr-2">{s.does}</td>
                  <td className="py-1.5 pr-2">{s.switchName}</td>
                  <td className="figures py-1.5 pr-2">{s.engages}</td>
                  <td className="figures py-1.5 pr-2">{s.onLoss}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        <p className="mt-2 text-sm text-ink-soft print:text-black">Flip each switch through every position and confirm the vehicle reports the function at the values above.</p>
      </Part>

      <Part title="Failsafe plan and bench test">
        <p className="text-sm font-semibold">{c.failsafePlan}</p>
        {c.benchTestRecord.state === "current" ? (
          <p className="mt-1 text-sm" data-testid="checklist-bench-test">
            {c.benchTestRecord.line}
          </p>
        ) : (
          <p className="mt-2 rounded-md border-l-4 border-watch bg-watch/10 px-3 py-2 text-sm font-semibold print:border-black print:bg-white" data-testid="checklist-bench-test">
            {c.benchTestRecord.line}
          </p>
        )}
        <ol className="mt-2 grid gap-2 text-sm">
          {c.benchTest.map((t, i) => (
            <Item key={i} id={`bench-${i}`}>
              <span className="figures mr-1">{i + 1}.</span>
              {t}
            </Item>
          ))}
        </ol>
        <div className="mt-3">
          <SafetyNote topic="failsafe" />
        </div>
      </Part>

      <Part title="Battery">
        <ul className="grid gap-2 text-sm">
          {c.battery.map((t, i) => (
            <Item key={i} id={`battery-${i}`}>
              {t}
            </Item>
          ))}
        </ul>
        <div className="mt-3">
          <SafetyNote topic="battery" />
        </div>
      </Part>

      <Part title="Rules and limits">
        <div className="grid gap-2">
          <SafetyNote topic="general" />
          <SafetyNote topic="range" />
        </div>
      </Part>
    </div>
  );
}
