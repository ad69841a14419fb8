"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper } from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Button } from "@/components/ui/button";
import { Callout } from "@/components/ui/callout";
import { Card } from "@/components/ui/card";
import { DataTable } from "@/components/ui/data-table";
import { errorMessage, fetchJson } from "@/lib/api/fetch-json";
import { QUERY_KEYS, type SiteRow } from "./admin-types";
import { ConfirmDialog } from "./confirm-dialog";
import { SiteFormDialog } from "./site-form-dialog";

type Editing = { site: SiteRow | null } | null;

/** The sites table: add, rename, delete (only empty sites). */
export function SitesAdmin() {
  const queryClient = useQueryClient();
  const sites = useQuery({
    queryKey: QUERY_KEYS.sites,
    queryFn: ({ signal }) => fetchJson<{ sites: SiteRow[] }>("/api/sites", { signal }).then((r) => r.sites),
  });
  const [editing, setEditing] = useState<Editing>(null);
  const [deleting, setDeleting] = useState<SiteRow | null>(null);
  const [notice, setNotice] = useState<string | null>(null);

  const remove = useMutation({
    mutationFn: (site: SiteRow) => fetchJson(`/api/sites/${site.id}`, { method: "DELETE" }),
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: QUERY_KEYS.sites });
      // Notices avoid repeating site names, which the table already shows.
      setNotice("The site was deleted.");
      setDeleting(null);
    },
  });

  const resetRemove = remove.reset;
  const columns = useMemo(() => {
    const col = createColumnHelper<SiteRow>();
    return [
      col.accessor("name", { header: "Name", cell: (c) => <span className="font-medium">{c.getValue()}</span> }),
      col.accessor("city", { header: "City", cell: (c) => c.getValue() || "—" }),
      col.accessor("scannerCount", { header: "Scanners", meta: { numeric: true } }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: ({ row }) => {
          const site = row.original;
          const blocked = site.scannerCount > 0;
          const reasonId = `site-${site.id}-delete-reason`;
          return (
            <div className="flex flex-wrap items-center justify-end gap-2">
              <Button
                variant="secondary"
                size="sm"
                onClick={() => {
                  setNotice(null);
                  setEditing({ site });
                }}
              >
                Rename<span className="sr-only"> {site.name}</span>
              </Button>
              <Button
                variant="secondary"
                size="sm"
                disabled={blocked}
                aria-describedby={blocked ? reasonId : undefined}
                onClick={() => {
                  setNotice(null);
                  resetRemove();
                  setDeleting(site);
                }}
              >
                Delete<span className="sr-only"> {site.name}</span>
              </Button>
              {blocked ? (
                <span id={reasonId} className="text-caption text-ink-subtle">
                  Has {site.scannerCount} scanner{site.scannerCount === 1 ? "" : "s"}: move or remove {site.scannerCount === 1 ? "it" : "them"} first
                </span>
              ) : null}
            </div>
          );
        },
        meta: { cellClassName: "text-right" },
      }),
    ];
  }, [resetRemove]);

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-start justify-between gap-3">
        <p className="max-w-prose text-body text-ink-muted">
          A site can be deleted only while it has no scanners (retired ones count too, since they keep their history).
        </p>
        <Button
          onClick={() => {
            setNotice(null);
            setEditing({ site: null });
          }}
        >
          Add site
        </Button>
      </div>

      <div aria-live="polite">{notice ? <Callout tone="success" role="status">{notice}</Callout> : null}</div>

      {sites.isError ? (
        <Callout
          tone="error"
          title="The sites could not be loaded"
          actions={
            <Button variant="secondary" size="sm" onClick={() => sites.refetch()}>
              Try again
            </Button>
          }
        >
          {errorMessage(sites.error)}
        </Callout>
      ) : (
        <Card>
          <DataTable
            data={sites.data ?? []}
            columns={columns}
            caption="Sites"
            loading={sites.isPending}
            getRowId={(s) => String(s.id)}
            filterPlaceholder="Name or city"
            emptyTitle="No sites yet"
            emptyDescription="Add the first hospital or clinic with “Add site”; scanners are registered at a site."
          />
        </Card>
      )}

      <SiteFormDialog
        open={editing !== null}
        site={editing?.site ?? null}
        onClose={() => setEditing(null)}
        onSaved={() => {
          setNotice(editing?.site ? "The site was renamed." : "The site was added.");
          setEditing(null);
        }}
      />

      <ConfirmDialog
        open={deleting !== null}
        title={`Delete ${deleting?.name ?? "site"}?`}
        confirmLabel="Delete site"
        pendingLabel="Deleting…"
        pending={remove.isPending}
        error={remove.error}
        onConfirm={() => {
          if (deleting) remove.mutate(deleting);
        }}
        onCancel={() => setDeleting(null)}
      >
        <p>The site has no scanners, so nothing else changes. This cannot be undone.</p>
      </ConfirmDialog>
    </div>
  );
}
