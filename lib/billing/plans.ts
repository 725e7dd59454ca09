/** Export credits and packs: typed config; money in integer cents. */
export type PackId = "pack25" | "pack100";

export type ExportPack = { id: PackId; name: string; credits: number; priceCents: number; currency: "eur" };

export const EXPORT_PACKS: Record<PackId, ExportPack> = {
  pack25: { id: "pack25", name: "Export pack 25", credits: 25, priceCents: 900, currency: "eur" },
  pack100: { id: "pack100", name: "Export pack 100", credits: 100, priceCents: 2900, currency: "eur" },
};

export const PACK_IDS = Object.keys(EXPORT_PACKS) as PackId[];

/** Free exports per studio per calendar month (UTC); unused ones do not carry over. */
export function monthlyAllowance(): number {
  const v = Number(process.env.FREE_MONTHLY_EXPORTS ?? 5);
  return Number.isInteger(v) && v >= 0 ? v : 5;
}

/** Export formats and what each costs in credits (CSV is free). */
export const EXPORT_COST = { midi: 1, musicxml: 1, csv: 0 } as const;
export type ExportFormat = keyof typeof EXPORT_COST;

export function formatPrice(cents: number, currency: string): string {
  return new Intl.NumberFormat("en-GB", { style: "currency", currency: currency.toUpperCase() }).format(cents / 100);
}
