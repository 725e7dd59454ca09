"use client";
import { useMutation } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";

/** Opens Stripe Checkout (or the local fake in development) for an export pack. */
export function useCheckout() {
  return useMutation({
    mutationFn: (pack: string) => apiFetch<{ url: string }>("/api/v1/billing/checkout", { method: "POST", json: { pack } }),
    onSuccess: ({ url }) => {
      window.location.assign(url);
    },
  });
}
