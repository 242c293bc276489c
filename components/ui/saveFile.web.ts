/**
 * Saves a fetched file in the browser: an object URL for the bytes and a click on an
 * `<a download>` naming the file. The object URL is released after the click has been handled,
 * so a run of PDFs does not pile up in the tab's memory.
 */
export async function saveFile(blob: Blob, filename: string): Promise<void> {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = filename;
  link.rel = 'noopener';
  link.style.display = 'none';
  document.body.appendChild(link);
  try {
    link.click();
  } finally {
    link.remove();
    // Chromium starts the download from the click synchronously, Firefox a turn later.
    setTimeout(() => URL.revokeObjectURL(url), 10_000);
  }
}
