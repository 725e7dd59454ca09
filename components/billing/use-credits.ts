"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";

export type CreditsDto = {
  balance: number;
  allowanceLeft: number;
  purchasedLeft: number;
  monthlyAllowance: number;
  period: string;
  purchases: { id: string; pack: string; credits: number; amountCents: number; currency: string; state: string; createdAt: string; paidAt?: string }[];
  ledger: { id: string; kind: string; amount: number; pool: string; period: string | null; detail: string; createdAt: string }[];
};

export const creditKeys = { all: ["credits"] as const };

/** Polls faster while a purchase is waiting for the payment provider's confirmation. */
export function useCredits(waitingForPayment: boolean) {
  return useQuery({
    queryKey: creditKeys.all,
    queryFn: () => apiFetch<CreditsDto>("/api/v1/credits"),
    refetchInterval: waitingForPayment ? 1000 : false,
  });
}
