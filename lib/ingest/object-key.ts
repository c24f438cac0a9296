import { randomBytes } from "node:crypto";

/**
 * Object keys never contain user-chosen path parts: the file name is reduced to a safe basename
 * (no "..", slashes or control characters) and placed under a random folder.
 */
export function safeFileName(name: string): string {
  const base = name.split(/[\\/]/).pop() ?? "";
  const cleaned = base
    .normalize("NFKC")
    .replace(/[\u0000-\u001f\u007f]/g, "")
    .replace(/[^\w.\- ()]+/g, "_")
    .replace(/^\.+/, "")
    .slice(0, 120)
    .trim();
  return cleaned || "log";
}

export function uploadObjectKey(crewId: number, fileName: string): string {
  return `crews/${crewId}/logs/${randomBytes(12).toString("hex")}/${safeFileName(fileName)}`;
}
