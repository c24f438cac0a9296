/**
 * Download names from a run's title for Content-Disposition (RFC 6266): an ASCII `filename` for
 * old clients and an RFC 5987 `filename*` in UTF-8. Neither can carry a path: slashes, backslashes,
 * control characters and leading dots are gone, so "../../etc/passwd" becomes a plain name.
 */

const MAX_STEM = 80;

/** Letters, digits, dot, dash, underscore; accents dropped; runs of anything else become one dash. */
export function asciiStem(title: string, fallback: string): string {
  const s = title
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .replace(/[^A-Za-z0-9._-]+/g, "-")
    .replace(/-{2,}/g, "-")
    .replace(/\.{2,}/g, ".")
    .replace(/^[-._]+|[-._]+$/g, "")
    .slice(0, MAX_STEM)
    .replace(/[-._]+$/g, "");
  return s || fallback;
}

/** The title as a file name in any script: only what no file system or header accepts is replaced. */
export function unicodeStem(title: string, fallback: string): string {
  const s = [...title.normalize("NFC").replace(/[\u0000-\u001f\u007f-\u009f/\\:*?"<>|]+/g, "-").replace(/\s+/g, " ")]
    .slice(0, MAX_STEM)
    .join("")
    .replace(/^[\s.-]+|[\s.-]+$/g, "");
  return s || fallback;
}

/** RFC 5987 value-chars: attr-char stays, everything else is %-encoded UTF-8. */
const rfc5987 = (s: string) => encodeURIComponent(s).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`);

/**
 * `attachment; filename="<ascii>"; filename*=UTF-8''<utf-8>` for `<stem><suffix>`, where suffix is
 * ours (e.g. ".gpx", "-events.csv").
 */
export function contentDisposition(title: string, suffix: string, fallback: string): string {
  const ascii = asciiStem(title, fallback) + suffix;
  const utf8 = unicodeStem(title, fallback) + suffix;
  return `attachment; filename="${ascii}"; filename*=UTF-8''${rfc5987(utf8)}`;
}
