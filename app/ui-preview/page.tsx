// GET /ui-preview – living style sheet of components/ui. Static, synthetic content, nothing fetched or saved.
import type { Metadata } from "next";
import type { ReactNode } from "react";
import {
  Button,
  Callout,
  Card,
  CardBody,
  CardDescription,
  CardFooter,
  CardHeader,
  CardTitle,
  ClinicalCaution,
  EmptyState,
  Field,
  Input,
  Metric,
  PageHeader,
  STATUS_LABELS,
  Select,
  Skeleton,
  SkeletonText,
  Spinner,
  StatusBadge,
  Table,
  TBody,
  Td,
  Textarea,
  Th,
  THead,
  Tr,
  buttonClasses,
  type Status,
} from "@/components/ui";
import { DataTableDemo, DialogDemo, InvalidFieldDemo, LoadingButtonDemo, TabsDemo } from "./preview-demos";

export const metadata: Metadata = { title: "UI preview", robots: { index: false, follow: false } };
export const dynamic = "force-static";

const SWATCHES: { name: string; className: string; text?: string }[] = [
  { name: "ink", className: "bg-ink", text: "text-ink-inverse" },
  { name: "ink-muted", className: "bg-ink-muted", text: "text-ink-inverse" },
  { name: "ink-subtle", className: "bg-ink-subtle", text: "text-ink-inverse" },
  { name: "surface", className: "bg-surface border border-line" },
  { name: "surface-canvas", className: "bg-surface-canvas border border-line" },
  { name: "surface-sunken", className: "bg-surface-sunken" },
  { name: "line", className: "bg-line" },
  { name: "line-control", className: "bg-line-control", text: "text-ink-inverse" },
  { name: "accent", className: "bg-accent", text: "text-ink-inverse" },
  { name: "accent-soft", className: "bg-accent-soft text-accent" },
  { name: "pass", className: "bg-pass", text: "text-ink-inverse" },
  { name: "pass-soft", className: "bg-pass-soft text-pass" },
  { name: "warn", className: "bg-warn", text: "text-ink-inverse" },
  { name: "warn-soft", className: "bg-warn-soft text-warn" },
  { name: "act", className: "bg-act", text: "text-ink-inverse" },
  { name: "act-soft", className: "bg-act-soft text-act" },
  { name: "info", className: "bg-info", text: "text-ink-inverse" },
  { name: "info-soft", className: "bg-info-soft text-info" },
];

const ALL_STATUSES = Object.keys(STATUS_LABELS) as Status[];

function Section({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <section aria-labelledby={id} className="flex flex-col gap-4">
      <h2 id={id} className="text-title font-semibold">
        {title}
      </h2>
      {children}
    </section>
  );
}

export default function UiPreviewPage() {
  return (
    <main className="mx-auto flex max-w-6xl flex-col gap-12 px-6 py-10">
      <PageHeader
        eyebrow="Halfmax · design system"
        title="UI preview"
        description="Every primitive in components/ui with synthetic values. Use it to check contrast, focus rings and spacing after a change."
        meta={
          <>
            <StatusBadge status="pass" size="sm" />
            <span>Inter, 14 px body</span>
            <span>Tokens in tailwind.config.ts</span>
          </>
        }
        actions={
          <>
            <a href="#tables" className={buttonClasses({ variant: "secondary" })}>
              Jump to tables
            </a>
            <Button>Primary action</Button>
          </>
        }
      />

      <Section id="colours" title="Colour tokens">
        <ul className="grid grid-cols-3 gap-3 sm:grid-cols-6">
          {SWATCHES.map((s) => (
            <li key={s.name} className={`flex h-16 items-end rounded-control p-2 text-caption font-medium ${s.className} ${s.text ?? ""}`}>
              {s.name}
            </li>
          ))}
        </ul>
      </Section>

      <Section id="type" title="Type scale">
        <div className="flex flex-col gap-1.5">
          <p className="text-display font-semibold">Display 28 — 1.23 mm</p>
          <p className="text-heading font-semibold">Heading 22 — Scanner CT-03</p>
          <p className="text-title font-semibold">Title 18 — MTF against baseline</p>
          <p className="text-lead">Lead 16 — The presampled MTF stays within tolerance.</p>
          <p className="text-body">Body 14 — Edge angle 2.6°, oversampling ×22, ROI 128 × 96 px.</p>
          <p className="text-caption text-ink-muted">Caption 12 — analysis 1.0.0, IEC 62220-1-1 edge method</p>
          <p className="tnum text-body">tnum: 0.100 1.111 10.010 — digits line up, zero is slashed</p>
        </div>
      </Section>

      <Section id="buttons" title="Buttons">
        <div className="flex flex-wrap items-center gap-3">
          <Button>Primary</Button>
          <Button variant="secondary">Secondary</Button>
          <Button variant="ghost">Ghost</Button>
          <Button variant="danger">Delete scan</Button>
          <Button disabled>Disabled</Button>
          <Button loading loadingText="Saving…">
            Save
          </Button>
          <Button variant="secondary" loading>
            Export
          </Button>
          <LoadingButtonDemo />
        </div>
        <div className="flex flex-wrap items-center gap-3">
          <Button size="sm">Small</Button>
          <Button size="md">Medium</Button>
          <Button size="lg">Large</Button>
          <Button size="icon" variant="secondary" aria-label="Refresh">
            <svg viewBox="0 0 16 16" aria-hidden="true" className="size-4">
              <path d="M13 8a5 5 0 1 1-1.5-3.5M13 2.5v3h-3" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
            </svg>
          </Button>
        </div>
      </Section>

      <Section id="forms" title="Form fields">
        <div className="grid gap-6 md:grid-cols-2">
          <Field label="Serial number" hint="As printed on the gantry label.">
            <Input placeholder="e.g. 40213" />
          </Field>
          <Field label="Modality" required>
            <Select placeholder="Choose a modality…" defaultValue="">
              <option value="ct">CT</option>
              <option value="pet">PET</option>
              <option value="nm">Gamma camera</option>
              <option value="dx">X-ray</option>
              <option value="mg">Mammography</option>
            </Select>
          </Field>
          <InvalidFieldDemo />
          <Field label="Tolerance" hint="Warning level, percent of baseline.">
            <Input type="number" defaultValue={10} suffix="%" />
          </Field>
          <Field label="Software version" hint="Read only: taken from the DICOM header.">
            <Input readOnly defaultValue="VA40A-SP02" />
          </Field>
          <Field label="Phantom">
            <Input disabled defaultValue="Edge plate W 1 mm" />
          </Field>
          <Field label="Notes" className="md:col-span-2">
            <Textarea placeholder="Acquisition notes" rows={3} />
          </Field>
        </div>
      </Section>

      <Section id="status" title="Status badges">
        <div className="flex flex-wrap gap-2">
          {ALL_STATUSES.map((s) => (
            <StatusBadge key={s} status={s} />
          ))}
        </div>
        <div className="flex flex-wrap gap-2">
          {ALL_STATUSES.map((s) => (
            <StatusBadge key={s} status={s} size="sm" />
          ))}
        </div>
      </Section>

      <Section id="callouts" title="Callouts">
        <ClinicalCaution />
        <Callout tone="info" title="Baseline set at acceptance">
          Values are compared with the baseline from 12 January 2026.
        </Callout>
        <Callout tone="error" title="The image could not be analysed" role="note">
          The edge ROI must be at least 32 px wide; this one is 20 px.
        </Callout>
        <Callout tone="success" title="Re-baseline signed">
          Signed by the responsible physicist.
        </Callout>
      </Section>

      <Section id="metrics" title="Metrics and cards">
        <div className="grid gap-6 md:grid-cols-3">
          <Card className="md:col-span-2">
            <CardHeader actions={<Button variant="secondary" size="sm">Details</Button>}>
              <CardTitle>CT-03 · wire phantom</CardTitle>
              <CardDescription>Last constancy test 3 March 2026</CardDescription>
            </CardHeader>
            <CardBody>
              <div className="grid grid-cols-2 gap-6 sm:grid-cols-4">
                <Metric label="FWHM" value={1.234} unit="mm" digits={2} size="lg" hint="baseline 1.21 mm" />
                <Metric label="MTF50" value={4.18} unit="lp/cm" digits={2} size="lg" hint={<StatusBadge status="pass" size="sm" />} />
                <Metric label="MTF10" value={-0.0001} unit="lp/cm" digits={2} size="lg" />
                <Metric label="FWTM" value={null} unit="mm" size="lg" hint="not measured" />
              </div>
            </CardBody>
            <CardFooter>
              <Button variant="ghost" size="sm">
                Cancel
              </Button>
              <Button size="sm">Sign off</Button>
            </CardFooter>
          </Card>
          <Card tone="sunken">
            <CardHeader>
              <CardTitle as="h3">Loading card</CardTitle>
            </CardHeader>
            <CardBody className="flex flex-col gap-3">
              <Skeleton className="h-6 w-24" />
              <SkeletonText lines={3} />
              <div className="flex items-center gap-2 text-ink-muted">
                <Spinner size="sm" label="Loading trend" /> <span>Spinner sm</span>
                <Spinner size="md" /> <Spinner size="lg" />
              </div>
            </CardBody>
          </Card>
        </div>
      </Section>

      <Section id="tables" title="Tables">
        <Card>
          <CardHeader>
            <CardTitle as="h3">Table shell (static)</CardTitle>
          </CardHeader>
          <CardBody flush>
            <Table caption="Resolution at three radial offsets" captionHidden density="compact">
              <THead>
                <Tr>
                  <Th>Offset</Th>
                  <Th numeric sort="asc">
                    Radial FWHM (mm)
                  </Th>
                  <Th numeric sort={false}>
                    Tangential FWHM (mm)
                  </Th>
                  <Th numeric>Axial FWHM (mm)</Th>
                  <Th>Result</Th>
                </Tr>
              </THead>
              <TBody>
                {[
                  ["1 cm", "4.20", "4.99", "4.79", "pass"],
                  ["10 cm", "4.69", "5.49", "4.81", "pass"],
                  ["20 cm", "5.07", "7.99", "4.95", "warning"],
                ].map(([offset, r, t, a, s]) => (
                  <Tr key={offset}>
                    <Td>{offset}</Td>
                    <Td numeric>{r}</Td>
                    <Td numeric>{t}</Td>
                    <Td numeric>{a}</Td>
                    <Td>
                      <StatusBadge status={s as Status} size="sm" />
                    </Td>
                  </Tr>
                ))}
              </TBody>
            </Table>
          </CardBody>
        </Card>
        <Card>
          <CardHeader>
            <CardTitle as="h3">DataTable</CardTitle>
            <CardDescription>Sort, filter, paginate; rows are links.</CardDescription>
          </CardHeader>
          <CardBody flush>
            <DataTableDemo />
          </CardBody>
        </Card>
        <div className="grid gap-6 md:grid-cols-2">
          <Card>
            <CardHeader>
              <CardTitle as="h3">DataTable loading</CardTitle>
            </CardHeader>
            <CardBody flush>
              <DataTableDemo loading />
            </CardBody>
          </Card>
          <Card>
            <CardHeader>
              <CardTitle as="h3">DataTable empty</CardTitle>
            </CardHeader>
            <CardBody flush>
              <DataTableDemo empty />
            </CardBody>
          </Card>
        </div>
      </Section>

      <Section id="misc" title="Tabs, dialog, empty state">
        <Card>
          <CardBody>
            <TabsDemo />
          </CardBody>
        </Card>
        <div className="flex items-center gap-3">
          <DialogDemo />
          <span className="text-caption text-ink-muted">Escape closes; focus returns to the button.</span>
        </div>
        <Card>
          <EmptyState
            title="No scans yet"
            description="Upload an edge, wire or point-source image to measure this scanner for the first time."
            action={<Button>Upload image</Button>}
          />
        </Card>
      </Section>
    </main>
  );
}
