/**
 * Native builds have no download folder the app can write to without a file-system package the
 * app does not ship; the web twin (saveFile.web.ts) saves the file. Saying so beats a silent
 * no-op: the download button shows this sentence as its error.
 */
export async function saveFile(blob: Blob, filename: string): Promise<void> {
  throw new Error(
    `${filename} (${blob.size} bytes) cannot be saved here: download files from Drybench in a browser.`,
  );
}
