"use client";
import { useMemo } from "react";
import { Alert, Badge, Button, Card, DataTable, Mono, PageHeader, Spinner, createDataTableColumns } from "@/components/ui";
import type { ExportPack } from "@/lib/billing/plans";
import { useCheckout } from "./use-checkout";
import { useCredits, type CreditsDto } from "./use-credits";

type Purchase = CreditsDto["purchases"][number];
type Ledger = CreditsDto["ledger"][number];
const purchaseCol = createDataTableColumns<Purchase>();
const ledgerCol = createDataTableColumns<Ledger>();
const dateFormat = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });
const money = (cents: number, currency: string) => new Intl.NumberFormat("en-GB", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);
const KIND_LABEL: Record<string, string> = { grant: "Monthly allowance", purchase: "Export pack", use: "Export" };

export function BillingView({ canBuy, packs, returned }: { canBuy: boolean; packs: ExportPack[]; returned: "success" | "cancelled" | null }) {
  const credits = useCredits(returned === "success");
  const checkout = useCheckout();
  const pendingAfterReturn = returned === "success" && !!credits.data?.purchases.some((p) => p.state === "pending") && !credits.data?.purchases.some((p) => p.state === "paid" && Date.now() - Date.parse(p.paidAt ?? "") < 10 * 60_000);

  const purchaseColumns = useMemo(
    () =>
      purchaseCol.columns([
        purchaseCol.accessor((p) => new Date(p.createdAt), { id: "createdAt", header: "Date", sortFn: "datetime", cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono> }),
        purchaseCol.accessor("credits", { header: "Credits", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue()}</Mono> }),
        purchaseCol.accessor("amountCents", { header: "Amount", meta: { align: "end" }, cell: (c) => <Mono>{money(c.getValue(), c.row.original.currency)}</Mono> }),
        purchaseCol.accessor("state", {
          header: "State",
          cell: (c) => <Badge tone={c.getValue() === "paid" ? "success" : c.getValue() === "failed" ? "danger" : "slate"}>{c.getValue()}</Badge>,
        }),
      ]),
    [],
  );
  const ledgerColumns = useMemo(
    () =>
      ledgerCol.columns([
        ledgerCol.accessor((l) => new Date(l.createdAt), { id: "createdAt", header: "Date", sortFn: "datetime", cell: (c) => <Mono>{dateFormat.format(c.getValue())}</Mono> }),
        ledgerCol.accessor("kind", { header: "What", cell: (c) => KIND_LABEL[c.getValue()] ?? c.getValue() }),
        ledgerCol.accessor("detail", { header: "Detail", enableSorting: false }),
        ledgerCol.accessor("amount", { header: "Credits", meta: { align: "end" }, cell: (c) => <Mono>{c.getValue() > 0 ? `+${c.getValue()}` : c.getValue()}</Mono> }),
      ]),
    [],
  );

  return (
    <div className="space-y-8">
      <PageHeader title="Billing" description="Export credits: MIDI and MusicXML exports use one credit each; CSV is free." />
      {returned === "success" ? (
        pendingAfterReturn ? (
          <Alert tone="info" title="Payment received">
            <span className="inline-flex items-center gap-2"><Spinner size="sm" /> Waiting for the payment provider to confirm; the credits appear here in a moment.</span>
          </Alert>
        ) : (
          <Alert tone="success" title="Thank you">Your export pack has been credited. A receipt is on its way by e-mail.</Alert>
        )
      ) : null}
      {returned === "cancelled" ? <Alert tone="info">The payment was cancelled; nothing was charged.</Alert> : null}
      {credits.isError ? <Alert tone="error" title="The balance could not be loaded">{credits.error.message}</Alert> : null}

      <div className="grid gap-4 sm:grid-cols-3">
        <Card>
          <p className="text-sm text-ink-muted">Credits available</p>
          <p className="mt-1 text-3xl font-semibold" data-testid="balance"><Mono>{credits.data ? credits.data.balance : "—"}</Mono></p>
        </Card>
        <Card>
          <p className="text-sm text-ink-muted">Free allowance left this month</p>
          <p className="mt-1 text-3xl font-semibold"><Mono>{credits.data ? `${credits.data.allowanceLeft} / ${credits.data.monthlyAllowance}` : "—"}</Mono></p>
        </Card>
        <Card>
          <p className="text-sm text-ink-muted">Bought credits left</p>
          <p className="mt-1 text-3xl font-semibold"><Mono>{credits.data ? credits.data.purchasedLeft : "—"}</Mono></p>
        </Card>
      </div>

      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Export packs</h2>
        {checkout.isError ? <Alert tone="error">{checkout.error.message}</Alert> : null}
        <div className="grid gap-4 sm:grid-cols-2">
          {packs.map((p) => (
            <Card key={p.id}>
              <h3 className="font-semibold">{p.name}</h3>
              <p className="text-sm text-ink-muted">{p.credits} exports, no expiry.</p>
              <p className="my-2 text-2xl"><Mono>{money(p.priceCents, p.currency)}</Mono></p>
              {canBuy ? (
                <Button loading={checkout.isPending && checkout.variables === p.id} onClick={() => checkout.mutate(p.id)}>
                  Buy {p.credits} credits
                </Button>
              ) : (
                <p className="text-sm text-ink-muted">Only the studio&apos;s owners buy export packs.</p>
              )}
            </Card>
          ))}
        </div>
      </section>

      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Purchases</h2>
        <DataTable columns={purchaseColumns} data={credits.data?.purchases ?? []} isLoading={credits.isPending} getRowId={(p) => p.id} initialSorting={[{ id: "createdAt", desc: true }]} emptyState={<p className="p-4 text-sm text-ink-muted">No purchases yet.</p>} />
      </section>
      <section className="space-y-3">
        <h2 className="text-lg font-semibold">Ledger</h2>
        <p className="text-sm text-ink-muted">Every grant, purchase and use of credits; the balance is their sum.</p>
        <DataTable columns={ledgerColumns} data={credits.data?.ledger ?? []} isLoading={credits.isPending} getRowId={(l) => l.id} initialSorting={[{ id: "createdAt", desc: true }]} />
      </section>
    </div>
  );
}
