import Link from "next/link";
import type { Metadata } from "next";
import { listScannersForUser } from "@/db/queries/scanners";
import { EmptyState, PageHeader, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { modalityLabel } from "@/lib/modalities";

export const metadata: Metadata = { title: "Scanners" };

export default async function ScannersPage() {
  const user = await requirePagePermission("viewFleet");
  const scanners = await listScannersForUser(user);
  const bySite = new Map<string, typeof scanners>();
  for (const s of scanners) bySite.set(s.siteName, [...(bySite.get(s.siteName) ?? []), s]);
  return (
    <div className="space-y-6">
      <PageHeader
        title="Scanners"
        description={user.role === "engineer" ? "The scanners you are assigned to service." : "Every active scanner, by site."}
      />
      {scanners.length === 0 ? (
        <EmptyState title="No scanners yet" description={user.role === "admin" ? "Add them in the scanner register." : "An administrator adds scanners in the scanner register."} />
      ) : (
        [...bySite.entries()].map(([site, list]) => (
          <section key={site} aria-labelledby={`site-${list[0]!.siteId}`}>
            <h2 id={`site-${list[0]!.siteId}`} className="mb-2 text-title font-semibold">{site}</h2>
            <Table caption={`Scanners at ${site}`} captionHidden>
              <THead>
                <Tr>
                  <Th>Name</Th>
                  <Th>Modality</Th>
                  <Th>Manufacturer and model</Th>
                  <Th>Serial number</Th>
                  <Th>Location</Th>
                  <Th>Physicist</Th>
                </Tr>
              </THead>
              <TBody>
                {list.map((s) => (
                  <Tr key={s.id}>
                    <Td>
                      <Link href={`/scanners/${s.id}`} className="font-medium text-accent underline-offset-2 hover:underline">{s.name}</Link>
                    </Td>
                    <Td>{modalityLabel(s.modality)}</Td>
                    <Td>{[s.manufacturer, s.model].filter(Boolean).join(" ") || "—"}</Td>
                    <Td className="tnum">{s.serialNumber || "—"}</Td>
                    <Td>{s.location || "—"}</Td>
                    <Td>{s.responsiblePhysicistName ?? "—"}</Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </section>
        ))
      )}
    </div>
  );
}
