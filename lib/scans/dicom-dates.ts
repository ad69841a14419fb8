/**
 * Test date of a scan from DICOM attributes (PS3.5 §6.2 value representations DA "YYYYMMDD", TM "HHMMSS.FFFFFF",
 * DT "YYYYMMDDHHMMSS.FFFFFF&ZZXX"). Times without an offset are taken as UTC. Returns null when nothing usable.
 */
export function parseDicomDateTime(date: string | null | undefined, time?: string | null): Date | null {
  if (!date) return null;
  const d = /^(\d{4})(\d{2})(\d{2})$/.exec(date.trim());
  if (!d) return null;
  const t = /^(\d{2})(\d{2})?(\d{2})?(?:\.(\d{1,6}))?$/.exec((time ?? "").trim().replace(/:/g, ""));
  const [h, mi, s, frac] = t ? [t[1], t[2] ?? "00", t[3] ?? "00", t[4] ?? "0"] : ["00", "00", "00", "0"];
  const ms = Math.round(Number(`0.${frac}`) * 1000);
  const value = Date.UTC(Number(d[1]), Number(d[2]) - 1, Number(d[3]), Number(h), Number(mi), Number(s), ms);
  const out = new Date(value);
  return Number.isNaN(out.getTime()) || out.getUTCFullYear() < 1900 ? null : out;
}

function parseDicomDt(dt: string | null | undefined): Date | null {
  if (!dt) return null;
  const m = /^(\d{8})(\d{2,6}(?:\.\d{1,6})?)?([+-]\d{4})?$/.exec(dt.trim());
  if (!m) return null;
  const base = parseDicomDateTime(m[1], m[2] ?? null);
  if (!base || !m[3]) return base;
  const sign = m[3][0] === "-" ? -1 : 1;
  const offsetMin = sign * (Number(m[3].slice(1, 3)) * 60 + Number(m[3].slice(3, 5)));
  return new Date(base.getTime() - offsetMin * 60_000);
}

/** Acquisition date/time, else content, series or study date/time; null when the file has none. */
export function testDateFromAttributes(a: Record<string, string | number | null>): Date | null {
  const s = (k: string) => (a[k] === null || a[k] === undefined ? null : String(a[k]));
  return (
    parseDicomDt(s("AcquisitionDateTime")) ??
    parseDicomDateTime(s("AcquisitionDate"), s("AcquisitionTime")) ??
    parseDicomDateTime(s("ContentDate"), s("ContentTime")) ??
    parseDicomDateTime(s("SeriesDate"), s("SeriesTime")) ??
    parseDicomDateTime(s("StudyDate"), s("StudyTime"))
  );
}
