/** The fields a scanner `<option>` needs. */
export interface ScannerOptionItem {
  id: number;
  name: string;
  siteName: string;
}

/**
 * The `<optgroup>`s of a scanner `<Select>`: one group per site, in the order the sites first appear in `scanners`,
 * each option valued by the scanner id and labelled by its name.
 */
export function ScannerOptionGroups({ scanners }: { scanners: readonly ScannerOptionItem[] }) {
  const bySite = new Map<string, ScannerOptionItem[]>();
  for (const s of scanners) bySite.set(s.siteName, [...(bySite.get(s.siteName) ?? []), s]);
  return [...bySite.entries()].map(([site, list]) => (
    <optgroup key={site} label={site}>
      {list.map((s) => (
        <option key={s.id} value={s.id}>
          {s.name}
        </option>
      ))}
    </optgroup>
  ));
}
