/**
 * A dynamic segment of an address as it was meant: pages get it percent-encoded. One whose
 * escapes do not decode (a stray "%E0") names nothing, so it stays as it is and is not found,
 * rather than throwing and answering with an error page.
 */
export function decodeSegment(segment: string): string {
  try {
    return decodeURIComponent(segment);
  } catch {
    return segment;
  }
}
