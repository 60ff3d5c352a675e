/** Saves a data: URL (an exported image) as a file with this name, as a link the user clicked would. */
export function downloadDataUrl(dataUrl: string, fileName: string) {
  const a = document.createElement("a");
  a.download = fileName;
  a.href = dataUrl;
  a.click();
}
