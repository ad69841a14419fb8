// GET /scanners/{id} – one scanner: identity, trend per metric, results, upload, schedule, baselines and tolerances
import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { cache } from "react";
import { getScannerForUser } from "@/db/queries/scanners";
import { listActiveUsersByRole } from "@/db/queries/users";
import { ScannerWorkspace } from "@/components/scanners/scanner-workspace";
import { ClinicalCaution, PageHeader } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { can } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";
import { modalityLabel } from "@/lib/modalities";

type Props = { params: Promise<{ scannerId: string }> };

/** The scanner if the signed-in user may see it; the 404 page otherwise (engineers see assigned scanners only). */
const loadScanner = cache(async (rawId: string) => {
  const user = await requirePagePermission("viewFleet");
  const id = Number(rawId);
  if (!Number.isSafeInteger(id) || id <= 0) notFound();
  try {
    return { user, scanner: await getScannerForUser(id, user) };
  } catch (err) {
    if (err instanceof AppError && err.code === "not_found") notFound();
    throw err;
  }
});

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { scanner } = await loadScanner((await params).scannerId);
  return { title: scanner.name };
}

export default async function ScannerPage({ params }: Props) {
  const { user, scanner } = await loadScanner((await params).scannerId);
  // Baselines are set by physicists: their names label the baseline history.
  const physicists = await listActiveUsersByRole("physicist");
  const people: Record<number, string> = Object.fromEntries(physicists.map((p) => [p.id, p.name]));
  people[user.id] = user.name;

  const facts: [string, string][] = [
    ["Manufacturer and model", [scanner.manufacturer, scanner.model].filter(Boolean).join(" ") || "—"],
    ["Serial number", scanner.serialNumber || "—"],
    ["Location", scanner.location || "—"],
    ["Responsible physicist", scanner.responsiblePhysicistName ?? "None assigned"],
    ["Service engineers", scanner.engineers.map((e) => e.name).join(", ") || "None assigned"],
  ];

  return (
    <div className="space-y-6">
      <PageHeader
        eyebrow={
          <nav aria-label="Breadcrumb">
            <ol className="flex flex-wrap items-center gap-1.5">
              <li>
                <Link href="/" className="text-accent underline-offset-2 hover:underline">Fleet</Link>
              </li>
              <li aria-hidden="true">/</li>
              <li>{scanner.siteName}</li>
            </ol>
          </nav>
        }
        title={scanner.name}
        description={`${modalityLabel(scanner.modality)} at ${scanner.siteName}${scanner.active ? "" : " — retired, kept for its QA history"}`}
        meta={
          <dl className="flex flex-wrap gap-x-6 gap-y-1.5" data-testid="scanner-facts">
            {facts.map(([k, v]) => (
              <div key={k} className="flex gap-1.5">
                <dt className="text-ink-subtle">{k}:</dt>
                <dd className="font-medium text-ink">{v}</dd>
              </div>
            ))}
          </dl>
        }
      />
      <ScannerWorkspace
        scannerId={scanner.id}
        scannerName={scanner.name}
        people={people}
        can={{
          viewReports: can(user.role, "viewReports"),
          uploadScans: can(user.role, "uploadScans"),
          manageSchedules: can(user.role, "manageSchedules"),
          manageBaselines: can(user.role, "manageBaselines"),
          manageTolerances: can(user.role, "manageTolerances"),
        }}
      />
      <ClinicalCaution />
    </div>
  );
}
