"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError, fetchJson } from "@/lib/api/fetch-json";
import { alertKeys, type AlertDetail } from "./alert-types";

export type AlertAction = "acknowledge" | "service" | "resolve";

/**
 * POST /api/alerts/{id}/{acknowledge|service|resolve} as a react-query mutation. On success the returned alert
 * replaces the cached detail, and every alert list and scanner view (open-alert counts, trend events) is refetched.
 */
export function useAlertAction<TBody>(alertId: number, action: AlertAction) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: TBody) => fetchJson<{ alert: AlertDetail }>(`/api/alerts/${alertId}/${action}`, { method: "POST", body }),
    onSuccess: async ({ alert }) => {
      queryClient.setQueryData(alertKeys.detail(alertId), alert);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: alertKeys.all }),
        queryClient.invalidateQueries({ queryKey: ["scanners"] }),
      ]);
    },
  });
}

/**
 * Put the server's 422 issues on the matching form fields; returns true when at least one matched (the field then shows
 * the message, so the dialog need not repeat it).
 */
export function applyServerIssues<T extends FieldValues>(err: unknown, fields: readonly Path<T>[], setError: UseFormSetError<T>): boolean {
  if (!(err instanceof ApiError) || err.status !== 422) return false;
  let matched = false;
  for (const issue of err.issues) {
    const field = fields.find((f) => f === issue.path);
    if (field) {
      setError(field, { type: "server", message: issue.message });
      matched = true;
    }
  }
  return matched;
}
