import { useEffect, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { useLiveStatus } from '@/components/live';
import {
  isApiError,
  isImportMoving,
  useImportCancelMutation,
  useImportQuery,
  useImportStartMutation,
  type Import,
  type ImportUploaded,
  type ShopSummary,
} from '@/components/queries';
import { space, type } from '@/components/theme';
import { Panel } from '@/components/ui';
import { IMPORT_FINISHED, IMPORT_FIELD_WORDS, IMPORT_WORDS } from '@/ingest/words';

import {
  checkChoices,
  COLUMN_FIELDS,
  initialChoices,
  mappingOf,
  placeStartError,
  type ChoiceErrors,
  type ImportChoices,
} from './importChoices';
import { ImportChoicesForm } from './ImportChoicesForm';
import { ImportFilePicker } from './ImportFilePicker';
import { ImportProgress } from './ImportProgress';
import { ImportSummary } from './ImportSummary';
import { PreviewTable } from './PreviewTable';

type Flow =
  | { step: 'pick' }
  | { step: 'choose'; uploaded: ImportUploaded }
  | { step: 'follow'; importId: string; dataRows: number | null };

interface ImportPanelProps {
  shop: ShopSummary;
  sensorId: string;
  /** The sensor's imports (newest first), to follow one already moving when the page opens. */
  imports: Import[] | undefined;
}

/** Data rows in a file of `lineCount` lines: all but the header. */
function dataRowsOf(lineCount: number | null): number | null {
  return lineCount === null ? null : Math.max(lineCount - 1, 0);
}

/**
 * "Import history from a logger file": pick a file (it is uploaded at once) → its first rows and
 * the column choices → Start → the progress bar with Cancel → the summary. Opened while an import
 * of the sensor is moving, the panel follows that one. Viewers see a moving import's progress
 * but never pick, start or cancel.
 */
export function ImportPanel({ shop, sensorId, imports }: ImportPanelProps) {
  const writer = shop.role !== 'viewer';
  const [flow, setFlow] = useState<Flow>({ step: 'pick' });
  const movingId = imports?.find((imp) => isImportMoving(imp.status))?.id;
  // An import already moving when the page opens (another tab, a reload) is followed to its end.
  useEffect(() => {
    if (movingId) {
      setFlow((held) =>
        held.step === 'pick' ? { step: 'follow', importId: movingId, dataRows: null } : held,
      );
    }
  }, [movingId]);
  const toChoose = (uploaded: ImportUploaded) => setFlow({ step: 'choose', uploaded });

  if (!writer && flow.step !== 'follow') return null;
  return (
    <Panel title={IMPORT_WORDS.panelTitle} testID="import-panel">
      {flow.step === 'follow' ? (
        <FollowImport
          shop={shop}
          sensorId={sensorId}
          importId={flow.importId}
          dataRows={flow.dataRows}
          onUploaded={toChoose}
        />
      ) : flow.step === 'choose' ? (
        <ChooseColumns
          key={flow.uploaded.import.id}
          shop={shop}
          sensorId={sensorId}
          uploaded={flow.uploaded}
          onUploaded={toChoose}
          onStarted={(imp) =>
            setFlow({
              step: 'follow',
              importId: imp.id,
              dataRows: dataRowsOf(flow.uploaded.preview.lineCount),
            })
          }
        />
      ) : (
        <>
          <Text style={type.small}>{IMPORT_WORDS.panelHint}</Text>
          <ImportFilePicker
            shopId={shop.id}
            sensorId={sensorId}
            label={IMPORT_WORDS.pick}
            onUploaded={toChoose}
          />
        </>
      )}
    </Panel>
  );
}

interface ChooseColumnsProps {
  shop: ShopSummary;
  sensorId: string;
  uploaded: ImportUploaded;
  onUploaded: (uploaded: ImportUploaded) => void;
  onStarted: (imp: Import) => void;
}

function ChooseColumns({ shop, sensorId, uploaded, onUploaded, onStarted }: ChooseColumnsProps) {
  const start = useImportStartMutation(shop.id, sensorId);
  const [choices, setChoices] = useState<ImportChoices>(() =>
    initialChoices(uploaded.preview, uploaded.suggested, shop.timeZone),
  );
  const [errors, setErrors] = useState<ChoiceErrors>({});
  const [formError, setFormError] = useState<string | null>(null);
  const rolesByColumn = new Map<string, string>();
  for (const field of COLUMN_FIELDS) {
    const column = choices[field];
    if (column !== null && !rolesByColumn.has(column)) {
      rolesByColumn.set(column, `→ ${IMPORT_FIELD_WORDS[field].replace(' (optional)', '')}`);
    }
  }

  const change = (next: ImportChoices) => {
    setChoices(next);
    // A field changed is a field answered: its refusal goes until the next press of Start.
    setErrors((held) => {
      const kept = { ...held };
      for (const key of Object.keys(held) as (keyof ChoiceErrors)[]) {
        if (next[key] !== choices[key]) delete kept[key];
      }
      return kept;
    });
    setFormError(null);
  };

  const send = () => {
    const local = checkChoices(choices);
    const mapping = mappingOf(choices);
    setErrors(local);
    setFormError(null);
    if (Object.keys(local).length > 0 || !mapping) return;
    start.mutate(
      { importId: uploaded.import.id, mapping, remember: choices.remember },
      {
        onSuccess: (answer) => onStarted(answer.import),
        onError: (error) => {
          if (!isApiError(error)) {
            setFormError(error.message);
            return;
          }
          const placed = placeStartError(error, choices);
          setErrors(placed.fields);
          setFormError(placed.form);
        },
      },
    );
  };

  return (
    <View style={styles.stack}>
      <View style={styles.file}>
        <Text style={[type.body, styles.fileName]} testID="import-file-name">
          {uploaded.import.fileName}
        </Text>
        <ImportFilePicker
          shopId={shop.id}
          sensorId={sensorId}
          label={IMPORT_WORDS.pickAnother}
          onUploaded={onUploaded}
          testID="import-file-again"
        />
      </View>
      <PreviewTable preview={uploaded.preview} rolesByColumn={rolesByColumn} />
      <ImportChoicesForm
        preview={uploaded.preview}
        choices={choices}
        onChange={change}
        errors={errors}
        formError={formError}
        sending={start.isPending}
        onStart={send}
        remembered={uploaded.suggested !== null}
      />
    </View>
  );
}

interface FollowImportProps {
  shop: ShopSummary;
  sensorId: string;
  importId: string;
  dataRows: number | null;
  onUploaded: (uploaded: ImportUploaded) => void;
}

function FollowImport({ shop, sensorId, importId, dataRows, onUploaded }: FollowImportProps) {
  const live = useLiveStatus();
  const query = useImportQuery(shop.id, sensorId, importId, live === 'open');
  const cancel = useImportCancelMutation(shop.id, sensorId);
  const writer = shop.role !== 'viewer';
  if (query.isError) {
    return (
      <Text style={type.body} role="alert">
        {query.error.message}
      </Text>
    );
  }
  const imp = query.data?.import;
  if (!imp) return <Text style={type.body}>Loading the import…</Text>;
  if (!IMPORT_FINISHED.includes(imp.status)) {
    return (
      <ImportProgress
        imp={imp}
        dataRows={dataRows}
        canCancel={writer}
        cancelling={cancel.isPending}
        // 409 import_finished: it ended before the cancel arrived; the summary follows.
        cancelError={cancel.error && !isApiError(cancel.error, 409) ? cancel.error.message : null}
        onCancel={() => cancel.mutate(imp.id)}
      />
    );
  }
  return (
    <View style={styles.stack}>
      <ImportSummary shopId={shop.id} imp={imp} timeZone={shop.timeZone} />
      {writer ? (
        <ImportFilePicker
          shopId={shop.id}
          sensorId={sensorId}
          label={IMPORT_WORDS.anotherFile}
          onUploaded={onUploaded}
          testID="import-file-next"
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  file: { gap: space.sm },
  fileName: { fontWeight: '600' },
});
