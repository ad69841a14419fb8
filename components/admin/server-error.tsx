import { Callout } from "@/components/ui/callout";
import { errorMessage } from "@/lib/api/fetch-json";

/** The server's error text in an error Callout (announced as an alert); renders nothing without an error. */
export function ServerError({ error, title, className }: { error: unknown; title: string; className?: string }) {
  if (error === null || error === undefined) return null;
  return (
    <Callout tone="error" title={title} className={className}>
      {errorMessage(error)}
    </Callout>
  );
}
