"use client";

import { useMutation, useQueryClient, type QueryKey } from "@tanstack/react-query";
import { fetchJson } from "@/lib/api/fetch-json";

/**
 * Save for an add/edit dialog of the register (sites, scanners): POST `collectionUrl` when `id` is null, else PATCH
 * `collectionUrl/{id}`. On success it invalidates every key in `invalidate`, resets itself and calls `onSaved`.
 * `close` resets the mutation and calls `onClose`, but does nothing while a save is running.
 */
export function useRegisterSave<TInput>({
  collectionUrl,
  id,
  invalidate,
  onSaved,
  onClose,
}: {
  collectionUrl: string;
  id: number | null;
  invalidate: readonly QueryKey[];
  onSaved: () => void;
  onClose: () => void;
}) {
  const queryClient = useQueryClient();
  const save = useMutation({
    mutationFn: (input: TInput) =>
      id !== null ? fetchJson(`${collectionUrl}/${id}`, { method: "PATCH", body: input }) : fetchJson(collectionUrl, { method: "POST", body: input }),
    onSuccess: async () => {
      await Promise.all(invalidate.map((queryKey) => queryClient.invalidateQueries({ queryKey })));
      save.reset();
      onSaved();
    },
  });
  const close = () => {
    if (save.isPending) return;
    save.reset();
    onClose();
  };
  return { save, close };
}
