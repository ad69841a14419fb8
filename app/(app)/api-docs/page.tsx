import type { Metadata } from "next";
import Link from "next/link";
import type { ReactNode } from "react";
import { buttonClasses, Card, CardBody, CardDescription, CardHeader, CardTitle, cn, PageHeader, Table, TBody, Td, Th, THead, Tr } from "@/components/ui";
import { requireUser } from "@/lib/auth/page-guards";
import { env } from "@/lib/env";
import { ERROR_STATUS } from "@/lib/errors";
import { getOpenApiDocument } from "@/lib/openapi/document";
import { buildApiReference, fieldsOf, type ReferenceField, type ReferenceOperation } from "@/lib/openapi/reference";
import { ERROR_MEANINGS, errorCodesFor, type ErrorStatus } from "@/lib/openapi/registry";

export const metadata: Metadata = { title: "API" };

/** Each error status once, in ascending order. */
const ERROR_STATUSES = [...new Set(Object.values(ERROR_STATUS))].sort((a, b) => a - b) as ErrorStatus[];

/** Reference of the HTTP API for script writers, rendered from the same OpenAPI document as /api/openapi.json. */
export default async function ApiDocsPage() {
  await requireUser();
  const doc = getOpenApiDocument();
  const sections = buildApiReference(doc);
  const base = env().APP_URL.replace(/\/$/, "");
  const examples = [
    "# list the scanners you may see",
    `curl -H "Authorization: Bearer $TOKEN" ${base}/api/scanners`,
    "",
    "# upload a phantom image for scanner 3; the answer holds the analysis (FWHM, MTF …)",
    `curl -H "Authorization: Bearer $TOKEN" -F file=@phantom.dcm -F scannerId=3 ${base}/api/scans`,
    "",
    "# the scanner's results since 1 January, 20 per page",
    `curl -H "Authorization: Bearer $TOKEN" "${base}/api/scans?scannerId=3&from=2026-01-01&pageSize=20"`,
  ].join("\n");

  return (
    <div className="flex max-w-5xl flex-col gap-6">
      <PageHeader
        title="API"
        description="Everything the app does with scanners, scans and results can also be done over HTTP, from scripts or other systems. Each call acts with your role."
        meta={
          <>
            <span>
              {doc.info.title} {doc.info.version}
            </span>
            <span>OpenAPI {doc.openapi}</span>
          </>
        }
        actions={
          <a href="/api/openapi.json" className={buttonClasses({ variant: "secondary" })}>
            OpenAPI document (JSON)
          </a>
        }
      />

      <Card aria-labelledby="api-start">
        <CardHeader>
          <CardTitle id="api-start">Getting started</CardTitle>
          <CardDescription>A personal API token, one header, and plain HTTP.</CardDescription>
        </CardHeader>
        <CardBody className="flex flex-col gap-4">
          <ol className="flex list-decimal flex-col gap-2 pl-5">
            <li>
              Create a token under{" "}
              <Link href="/account" className="font-medium text-accent underline underline-offset-2">
                Account &amp; tokens
              </Link>
              . The secret is shown once: keep it in your script&apos;s configuration, not in its code. On the server, an
              administrator can also print one with <Code>npm run --silent token -- &lt;email&gt;</Code>.
            </li>
            <li>
              Send it with every request as <Code>Authorization: Bearer &lt;token&gt;</Code>. Revoke it on the same page when the
              script is retired.
            </li>
            <li>
              Send JSON bodies with <Code>content-type: application/json</Code>, uploads as <Code>multipart/form-data</Code>. Widths
              are in mm, spatial frequencies in cycles/mm.
            </li>
          </ol>
          <pre className="overflow-x-auto rounded-control border border-line bg-surface-sunken px-3 py-2 text-caption">
            <code>{`export TOKEN=…   # your token\n\n${examples}`}</code>
          </pre>
          <p className="text-ink-muted">
            The machine-readable description is at{" "}
            <a href="/api/openapi.json" className="font-medium text-accent underline underline-offset-2">
              /api/openapi.json
            </a>{" "}
            (OpenAPI 3.1, no sign-in needed): load it into a client generator or an HTTP tool. This page is drawn from the same document.
          </p>
        </CardBody>
      </Card>

      <Card aria-labelledby="api-errors">
        <CardHeader>
          <CardTitle id="api-errors">Errors</CardTitle>
          <CardDescription>
            Every error is JSON <Code>{`{ "error": "…", "code": "…" }`}</Code>: <Code>error</Code> is for people, <Code>code</Code> for
            scripts. Validation errors add <Code>issues</Code>, one entry per field with its <Code>path</Code> and <Code>message</Code>.
          </CardDescription>
        </CardHeader>
        <CardBody flush>
          <Table caption="Error statuses and codes" captionHidden density="compact">
            <THead>
              <Tr>
                <Th>Status</Th>
                <Th>Code</Th>
                <Th>Meaning</Th>
              </Tr>
            </THead>
            <TBody>
              {ERROR_STATUSES.map((status) => (
                <Tr key={status}>
                  <Td className="tnum font-medium">{status}</Td>
                  <Td>
                    {errorCodesFor(status).map((code, i) => (
                      <span key={code}>
                        {i > 0 ? ", " : null}
                        <Code>{code}</Code>
                      </span>
                    ))}
                  </Td>
                  <Td wrap>{inlineCode(ERROR_MEANINGS[status])}</Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </CardBody>
      </Card>

      <nav aria-labelledby="api-contents" className="flex flex-col gap-2">
        <h2 id="api-contents" className="text-title font-semibold">
          Operations
        </h2>
        <ul className="grid gap-x-8 gap-y-1 sm:grid-cols-2">
          {sections.map((s) => (
            <li key={s.tag}>
              <a href={`#tag-${s.tag}`} className="font-medium text-accent underline-offset-2 hover:underline">
                {s.tag}
              </a>{" "}
              <span className="text-ink-muted">— {s.description}</span>
            </li>
          ))}
        </ul>
      </nav>

      {sections.map((section) => (
        <section key={section.tag} aria-labelledby={`tag-${section.tag}`} className="flex flex-col gap-3">
          <div>
            <h2 id={`tag-${section.tag}`} className="scroll-mt-4 text-heading font-semibold">
              {section.tag}
            </h2>
            {section.description ? <p className="text-ink-muted">{section.description}</p> : null}
          </div>
          {section.operations.map((op) => (
            <OperationCard key={op.id} op={op} />
          ))}
        </section>
      ))}

      <Card aria-labelledby="api-result">
        <CardHeader>
          <CardTitle id="api-result">Analysis result fields</CardTitle>
          <CardDescription>
            The keys of <Code>analysis</Code> in a scan (also the analysis command&apos;s JSON). They are a fixed contract: new keys may be added, these keep
            their names and units.
          </CardDescription>
        </CardHeader>
        <CardBody flush>
          <FieldTable caption="Analysis result fields" fields={fieldsOf({ $ref: "#/components/schemas/AnalysisResult" }, doc)} />
        </CardBody>
      </Card>
    </div>
  );
}

const METHOD_TONES: Record<string, string> = {
  GET: "border-info-line bg-info-soft text-info",
  POST: "border-pass-line bg-pass-soft text-pass",
  PUT: "border-warn-line bg-warn-soft text-warn",
  PATCH: "border-warn-line bg-warn-soft text-warn",
  DELETE: "border-act-line bg-act-soft text-act",
};

function MethodBadge({ method }: { method: string }) {
  return (
    <span
      className={cn(
        "inline-flex w-16 shrink-0 justify-center rounded-chip border px-1.5 py-0.5 font-mono text-caption font-semibold",
        METHOD_TONES[method] ?? "border-line-strong bg-surface-sunken text-ink-muted",
      )}
    >
      {method}
    </span>
  );
}

function OperationCard({ op }: { op: ReferenceOperation }) {
  const titleId = `op-${op.id}`;
  return (
    <Card as="article" aria-labelledby={titleId} id={op.id} className="scroll-mt-4">
      <CardHeader>
        <h3 id={titleId} className="flex flex-wrap items-center gap-x-3 gap-y-1">
          <MethodBadge method={op.method} />
          <code className="font-mono text-body font-semibold break-all text-ink">{op.path}</code>
        </h3>
        <p className="text-body text-ink">{op.summary}</p>
      </CardHeader>
      <CardBody className="flex flex-col gap-4">
        {op.description.map((paragraph, i) => (
          <p key={i} className="text-ink-muted">
            {inlineCode(paragraph)}
          </p>
        ))}
        {op.parameters.length ? (
          <div className="flex flex-col gap-1.5">
            <h4 className="text-caption font-semibold text-ink-muted">Parameters</h4>
            <FieldTable caption={`Parameters of ${op.method} ${op.path}`} fields={op.parameters} showLocation />
          </div>
        ) : null}
        {op.body ? (
          <div className="flex flex-col gap-1.5">
            <h4 className="text-caption font-semibold text-ink-muted">
              Request body <span className="font-mono font-normal">{op.body.mediaType}</span>
              {op.body.required ? null : <span className="font-normal"> (optional)</span>}
            </h4>
            <FieldTable caption={`Request body of ${op.method} ${op.path}`} fields={op.body.fields} />
          </div>
        ) : null}
        <div className="flex flex-col gap-1.5">
          <h4 className="text-caption font-semibold text-ink-muted">Responses</h4>
          <Table caption={`Responses of ${op.method} ${op.path}`} captionHidden density="compact">
            <THead>
              <Tr>
                <Th>Status</Th>
                <Th>Meaning</Th>
                <Th>Body</Th>
              </Tr>
            </THead>
            <TBody>
              {op.responses.map((r) => (
                <Tr key={r.status}>
                  <Td className="tnum font-medium">{r.status}</Td>
                  <Td wrap>{inlineCode(r.description)}</Td>
                  <Td wrap muted>
                    {r.shape ? <Code>{r.shape}</Code> : r.mediaTypes.join(", ") || "—"}
                  </Td>
                </Tr>
              ))}
            </TBody>
          </Table>
        </div>
      </CardBody>
    </Card>
  );
}

function FieldTable({ caption, fields, showLocation = false }: { caption: string; fields: ReferenceField[]; showLocation?: boolean }) {
  return (
    <Table caption={caption} captionHidden density="compact">
      <THead>
        <Tr>
          <Th>Name</Th>
          {showLocation ? <Th>In</Th> : null}
          <Th>Type</Th>
          <Th>Required</Th>
          <Th>Description</Th>
        </Tr>
      </THead>
      <TBody>
        {fields.map((f) => (
          <Tr key={`${f.location ?? ""}:${f.name}`}>
            <Td>
              <Code>{f.name}</Code>
            </Td>
            {showLocation ? <Td muted>{f.location}</Td> : null}
            <Td wrap className="font-mono text-caption">
              {f.type}
            </Td>
            <Td muted>{f.required ? "yes" : "no"}</Td>
            <Td wrap>{inlineCode(f.description) || "—"}</Td>
          </Tr>
        ))}
      </TBody>
    </Table>
  );
}

function Code({ children }: { children: ReactNode }) {
  return <code className="rounded-chip bg-surface-sunken px-1 py-px font-mono text-[0.8125rem] text-ink">{children}</code>;
}

/** Text with `backtick` spans shown as code (the document's descriptions use that Markdown convention). */
function inlineCode(text: string): ReactNode {
  if (!text.includes("`")) return text;
  return text.split(/(`[^`]+`)/g).map((part, i) => (part.startsWith("`") && part.endsWith("`") ? <Code key={i}>{part.slice(1, -1)}</Code> : part));
}
