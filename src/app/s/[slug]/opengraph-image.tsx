import { PERMALINK_IMAGE_SIZE, permalinkImageForSlug } from "@/server/og";

export const size = PERMALINK_IMAGE_SIZE;
export const contentType = "image/png";
export const alt = "A shared Framefork path: its input, hit levels and ending on block";
export const dynamic = "force-dynamic";

/** The link preview: the path for a link anyone may open, a plain card for everything else. */
export default async function Image({ params }: { params: Promise<{ slug: string }> }) {
  const { slug } = await params;
  return permalinkImageForSlug({ slug });
}
