"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Card } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { ActiveChip } from "./active-chip";
import { QUERY_KEYS, type ScannerRow } from "./admin-types";
import { ConfirmDialog } from "./confirm-dialog";
import { modalityOptionLabel } from "@/lib/modalities";
import { ScannerFormDialog } from "./scanner-form-dialog";

type Editing = { scanner: ScannerRow | null } | null;

/** The scanner register: every scanner including retired ones; add, edit, remove. */
export function ScannersAdmin() {
  const queryClient = useQueryClient();
  const scanners = useQuery({
    queryKey: QUERY_KEYS.scannerRegister,
    queryFn: ({ signal }) => fetchJson<{ scanners: ScannerRow[] }>("/api/scanners?includeInactive=1", { signal }).then((r) => r.scanners),
  });
  const [editing, setEditing] = useState<Editing>(null);
  const [removing, setRemoving] = useState<ScannerRow | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const remove = useMutation({
    mutationFn: (scanner: ScannerRow) => fetchJson<{ outcome: "deleted" | "retired" }>(`/api/scanners/${scanner.id}`, { method: "DELETE" }),
    onSuccess: async ({ outcome }) => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: ["scanners"] }),
        queryClient.invalidateQueries({ queryKey: QUERY_KEYS.sites }),
      ]);
      // Notices avoid repeating the scanner's name, which the table already shows.
      setNotice(
        outcome === "retired"
          ? `The scanner has scans, so it was retired: it leaves the fleet lists and keeps its full QA history.`
          : `The scanner had no scans and was deleted.`,
      );
      setRemoving(null);
    },
  });

  const resetRemove = remove.reset;
  const columns = useMemo(() => {
    const col = createColumnHelper<ScannerRow>();
    return [
      col.accessor("name", {
        header: "Name",
        cell: ({ row }) => (
          <Link href={`/scanners/${row.original.id}`} className="font-medium text-accent underline-offset-2 hover:underline">
            {row.original.name}
          </Link>
        ),
      }),
      col.accessor("siteName", { header: "Site" }),
      col.accessor("modality", {
        header: "Modality",
        cell: (c) => (
          <abbr title={modalityOptionLabel(c.getValue())} className="no-underline">
            {c.getValue()}
          </abbr>
        ),
      }),
      col.accessor((s) => [s.manufacturer, s.model].filter(Boolean).join(" "), {
        id: "make",
        header: "Manufacturer / model",
        cell: (c) => c.getValue() || "—",
      }),
      col.accessor("serialNumber", { header: "Serial number", meta: { muted: true }, cell: (c) => <span className="tnum">{c.getValue() || "—"}</span> }),
      col.accessor("location", { header: "Location", cell: (c) => c.getValue() || "—" }),
      col.accessor((s) => s.responsiblePhysicistName ?? "", { id: "physicist", header: "Responsible physicist", cell: (c) => c.getValue() || "—" }),
      col.accessor((s) => s.engineers.map((e) => e.name).join(", "), { id: "engineers", header: "Engineers", cell: (c) => c.getValue() || "—" }),
      col.accessor((s) => (s.active ? "Active" : "Retired"), {
        id: "active",
        header: "Status",
        cell: ({ row }) => <ActiveChip active={row.original.active} inactiveLabel="Retired" />,
      }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        meta: { cellClassName: "text-right" },
        cell: ({ row }) => {
          const scanner = row.original;
          return (
            <div className="flex justify-end gap-2">
              <Button
                variant="secondary"
                size="sm"
                onClick={() => {
                  setNotice(null);
                  setEditing({ scanner });
                }}
              >
                Edit<span className="sr-only"> {scanner.name}</span>
              </Button>
              {scanner.active ? (
                <Button
                  variant="secondary"
                  size="sm"
                  onClick={() => {
                    setNotice(null);
                    resetRemove();
                    setRemoving(scanner);
                  }}
                >
                  Remove<span className="sr-only"> {scanner.name}</span>
                </Button>
              ) : null}
            </div>
          );
        },
      }),
    ];
  }, [resetRemove]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <p className="max-w-prose text-body text-ink-muted">
          Removing a scanner deletes it only if it has no scans. A scanner with scans is retired instead: it disappears from the fleet lists
          and takes no new scans, but keeps its history.
        </p>
        <Button
          onClick={() => {
            setNotice(null);
            setEditing({ scanner: null });
          }}
        >
          Add scanner
        </Button>
      </div>

      <div aria-live="polite">{notice ? <Callout tone="success" role="status">{notice}</Callout> : null}</div>

      {scanners.isError ? (
        <Callout
          tone="error"
          title="The scanner register could not be loaded"
          actions={
            <Button variant="secondary" size="sm" onClick={() => scanners.refetch()}>
              Try again
            </Button>
          }
        >
          {errorMessage(scanners.error)}
        </Callout>
      ) : (
        <Card>
          <DataTable
            data={scanners.data ?? []}
            columns={columns}
            caption="Scanner register"
            loading={scanners.isPending}
            getRowId={(s) => String(s.id)}
            filterPlaceholder="Name, site, modality, serial…"
            initialPageSize={50}
            emptyTitle="No scanners registered"
            emptyDescription="Add the first scanner with “Add scanner”. You need at least one site first."
          />
        </Card>
      )}

      <ScannerFormDialog
        open={editing !== null}
        scanner={editing?.scanner ?? null}
        onClose={() => setEditing(null)}
        onSaved={() => {
          setNotice(editing?.scanner ? "Changes to the scanner were saved." : "The scanner was added to the register.");
          setEditing(null);
        }}
      />

      <ConfirmDialog
        open={removing !== null}
        title={`Remove ${removing?.name ?? "scanner"}?`}
        confirmLabel="Remove scanner"
        pendingLabel="Removing…"
        pending={remove.isPending}
        error={remove.error}
        onConfirm={() => {
          if (removing) remove.mutate(removing);
        }}
        onCancel={() => setRemoving(null)}
      >
        <p>If the scanner has no scans yet, it is deleted together with its tests and settings.</p>
        <p>
          If it has scans, it is retired instead: it leaves the fleet lists and takes no new scans, but its scans, results, baselines and
          alerts stay available.
        </p>
      </ConfirmDialog>
    </div>
  );
}
