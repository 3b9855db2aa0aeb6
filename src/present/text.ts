/** Text helpers shared by the faces: HTML escaping for the report (and anything else that writes HTML). */

/** Escape text for HTML content and attribute values. */
export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}
