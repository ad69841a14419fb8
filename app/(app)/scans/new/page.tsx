// GET /scans/new – add phantom scans: choose the scanner, drop the images, follow each upload to its result
import type { Metadata } from "next";
import Link from "next/link";
import { listScannersForUser } from "@/db/queries/scanners";
import { UploadDropzone } from "@/components/scans/upload-dropzone";
import { Card, CardBody, CardHeader, CardTitle, ClinicalCaution, EmptyState, PageHeader } from "@/components/ui";
import { requirePagePermission } from "@/lib/auth/page-guards";
import { can } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Add scans" };

export default async function AddScansPage({ searchParams }: { searchParams: Promise<{ scannerId?: string | string[] }> }) {
  const user = await requirePagePermission("uploadScans");
  const [{ scannerId: rawScannerId }, scanners] = await Promise.all([searchParams, listScannersForUser(user)]);
  const wanted = Number(Array.isArray(rawScannerId) ? rawScannerId[0] : rawScannerId);
  const preselected = scanners.find((s) => s.id === wanted)?.id;
  const options = scanners.map((s) => ({ id: s.id, name: s.name, siteName: s.siteName, modality: s.modality }));

  return (
    <div className="space-y-6">
      <PageHeader
        title="Add scans"
        description="Upload phantom images of a point source, line source, slanted edge or disk insert. Each file is analysed at once and compared with the scanner's baseline."
      />

      {options.length === 0 ? (
        <EmptyState
          title="No scanners to upload to"
          description={
            can(user.role, "manageScanners") ? (
              <>
                Add a scanner in the <Link href="/admin/scanners" className="font-medium text-accent underline">scanner register</Link> first.
              </>
            ) : (
              "An administrator adds scanners in the scanner register."
            )
          }
        />
      ) : (
        <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_22rem]">
          <Card aria-labelledby="upload-title">
            <CardHeader>
              <CardTitle id="upload-title">Phantom images</CardTitle>
            </CardHeader>
            <CardBody>
              <UploadDropzone scanners={options} defaultScannerId={preselected} />
            </CardBody>
          </Card>

          <Card tone="sunken" aria-labelledby="formats-title">
            <CardHeader>
              <CardTitle id="formats-title" as="h2">
                Supported files
              </CardTitle>
            </CardHeader>
            <CardBody className="space-y-3 text-body text-ink-muted">
              <p>
                <strong className="font-semibold text-ink">DICOM</strong> (CT, PET, NM, DX, CR, MG): uncompressed or JPEG Lossless. Pixel Spacing
                (or Imager Pixel Spacing) and the rescale are read from the header. Lossy compression alters the MTF: lossy transfer syntaxes are refused, and a
                lossy-compression history is flagged.
              </p>
              <p>
                <strong className="font-semibold text-ink">PNG or TIFF</strong>, 8- or 16-bit greyscale: these files carry no pixel spacing, so you are asked
                for it in mm (one number, or row,column).
              </p>
              <p>
                Choose the method per file, or leave <em>Automatic</em> to let Halfmax recognise the phantom. Prefer raw (&ldquo;for
                processing&rdquo;) radiographs: edge enhancement raises the MTF.
              </p>
              <p>Frequencies are reported in cycles/mm (= lp/mm), widths in mm.</p>
            </CardBody>
          </Card>
        </div>
      )}

      <ClinicalCaution />
    </div>
  );
}
