import type { Metadata } from "next";
import { listApiTokens } from "@/db/queries/api-tokens";
import { PageHeader } from "@/components/ui/page-header";
import { getPageContext } from "@/lib/auth/page-context";
import { CreateTokenForm } from "./create-token-form";
import { RevokeTokenButton } from "./revoke-token-button";

export const metadata: Metadata = { title: "API tokens" };

const when = (d: Date | null) => (d ? d.toISOString().slice(0, 16).replace("T", " ") + " UTC" : "never");

export default async function TokensPage() {
  const { actor } = await getPageContext();
  const tokens = await listApiTokens(actor.user.id);
  return (
    <>
      <PageHeader
        title="API tokens"
        lead="A token acts as you, in every crew you belong to, with your role there. Give each device its own token and revoke it when the device is lost."
      />
      <section className="panel" aria-labelledby="new-token-h">
        <h2 id="new-token-h" className="mb-4 text-lg font-semibold">
          New token
        </h2>
        <CreateTokenForm />
      </section>
      <section className="mt-6 rounded-lg border border-rule bg-card" aria-labelledby="tokens-h">
        <h2 id="tokens-h" className="border-b border-rule px-4 py-3 text-lg font-semibold">
          Your tokens
        </h2>
        {tokens.length === 0 ? (
          <p className="px-4 py-3 text-ink-soft">No tokens yet.</p>
        ) : (
          <ul className="divide-y divide-rule">
            {tokens.map((t) => (
              <li key={t.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
                <div>
                  <p className="font-medium">
                    {t.name} {t.revokedAt && <span className="ml-2 rounded bg-act/10 px-2 py-0.5 text-xs text-act">revoked</span>}
                  </p>
                  <p className="figures text-sm text-ink-soft">
                    {t.tokenPrefix}… · created {when(t.createdAt)} · last used {when(t.lastUsedAt)}
                  </p>
                </div>
                {!t.revokedAt && <RevokeTokenButton tokenId={t.id} name={t.name} />}
              </li>
            ))}
          </ul>
        )}
      </section>
    </>
  );
}
