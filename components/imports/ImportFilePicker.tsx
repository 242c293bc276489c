import { FilePicker } from '@/components/forms';
import { useImportUploadMutation, type ImportUploaded } from '@/components/queries';
import { formatFileSize, IMPORT_WORDS } from '@/ingest/words';

export interface ImportFilePickerProps {
  shopId: string;
  sensorId: string;
  /** The label of the button: "Choose a CSV file", or "Choose another file" after one. */
  label: string;
  onUploaded: (answer: ImportUploaded) => void;
  testID?: string;
}

/**
 * A logger's file, picked and sent at once (the shared FilePicker; native builds say to use a
 * browser). While it goes, "Uploading <file>…" with its size is announced; a refusal (too
 * large, empty, not text, no header, one column) shows the server's own sentence.
 */
export function ImportFilePicker({
  shopId,
  sensorId,
  label,
  onUploaded,
  testID = 'import-file',
}: ImportFilePickerProps) {
  const upload = useImportUploadMutation(shopId, sensorId);
  return (
    <FilePicker
      accept=".csv,.txt,.tsv,text/csv,text/plain,text/tab-separated-values"
      label={label}
      variant="primary"
      send={(file) =>
        upload.mutate({ file, fileName: file.name || 'logger.csv' }, { onSuccess: onUploaded })
      }
      pending={upload.isPending}
      error={upload.isError ? upload.error.message : null}
      uploading={(file) => `${IMPORT_WORDS.uploading(file.name)} (${formatFileSize(file.size)})`}
      retryAccessibilityLabel={(file) => `Try again to upload ${file.name}`}
      browserOnly={IMPORT_WORDS.browserOnly}
      testID={testID}
    />
  );
}
