/**
 * DICOM UIDs for files Halfmax writes. Root "2.25" (PS3.5 §B.2): the decimal value of a 128-bit UUID (ITU-T X.667),
 * so no registered organisation root is needed.
 */

/** Halfmax's Implementation Class UID (0002,0012): 2.25 + the decimal form of UUID b5751a32-f500-4577-8940-4aea6464c667. */
export const HALFMAX_IMPLEMENTATION_CLASS_UID = "2.25.241198297349400323939344440053792556647";

/** Implementation Version Name (0002,0013), SH ≤ 16 characters. */
export const HALFMAX_IMPLEMENTATION_VERSION_NAME = "HALFMAX_1_0";

/** UID "2.25.<decimal>" of a UUID given as 32 hex digits (dashes allowed). */
export function uidFromUuid(uuid: string): string {
  const hex = uuid.replace(/-/g, "");
  if (!/^[0-9a-fA-F]{32}$/.test(hex)) throw new Error(`expected a UUID of 32 hex digits, got "${uuid}"`);
  return `2.25.${BigInt(`0x${hex}`).toString(10)}`;
}

/** A new random UID (version-4 UUID from the platform's crypto.randomUUID, available in Node ≥ 19 and browsers). */
export function newUid(): string {
  return uidFromUuid(globalThis.crypto.randomUUID());
}

/**
 * Checks a UID against PS3.5 §9.1: ≤ 64 characters, dot-separated decimal components without leading zeros.
 * @throws Error naming the UID when it is invalid.
 */
export function checkUid(uid: string, what: string): string {
  const ok = uid.length <= 64 && /^(0|[1-9][0-9]*)(\.(0|[1-9][0-9]*))*$/.test(uid);
  if (!ok) throw new Error(`${what} "${uid}" is not a valid DICOM UID (digits and dots, ≤ 64 characters, no leading zeros)`);
  return uid;
}
