import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, View } from 'react-native';
import {
  BOX_MAX_COLUMNS,
  BOX_MAX_ROWS,
  BoxCreateInput,
  PLACE_KIND_LABELS,
  PLACE_KINDS,
  StoragePlaceCreateInput,
  type StoragePlace,
} from '@/shared/schemas/storage';
import { slotName, type AxisLabels } from '@/shared/slots';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { ChoiceChips } from '@/components/ui/choice-chips';
import { errorsFromIssues, errorsFromRequest, partitionErrors, type PathErrors } from '@/components/ui/field-errors';
import { FormProblem } from '@/components/ui/form-problem';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { usePlacesQuery, useCreateBoxMutation, useCreatePlaceMutation } from '@/hooks/use-storage';

type PlaceKind = (typeof PLACE_KINDS)[number];

const NO_PLACE = 'none';
const AXIS_CHOICES: { value: AxisLabels; label: string }[] = [
  { value: 'letters', label: 'Letters (A, B, C…)' },
  { value: 'numbers', label: 'Numbers (1, 2, 3…)' },
];

/** "Top level" plus every existing place, by its path. */
function placeChoices(places: readonly StoragePlace[], none: string) {
  return [{ value: NO_PLACE, label: none }, ...places.map((place) => ({ value: String(place.id), label: place.path }))];
}

/** A failed request, unless every one of its messages is already shown beside a field. */
function unplaced(error: unknown, placed: PathErrors, rest: string[]): unknown {
  return error && (rest.length > 0 || Object.keys(placed).length === 0) ? error : undefined;
}

function wholeNumber(text: string): number {
  return /^\s*\d+\s*$/.test(text) ? Number(text) : Number.NaN;
}

export function AddPlaceCard({ onClose }: { onClose: () => void }) {
  const places = usePlacesQuery();
  const create = useCreatePlaceMutation();
  const [name, setName] = useState('');
  const [kind, setKind] = useState<PlaceKind | null>(null);
  const [parent, setParent] = useState(NO_PLACE);
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<PathErrors>({});

  const submit = () => {
    const parsed = StoragePlaceCreateInput.safeParse({
      name,
      kind: kind ?? undefined,
      parentId: parent === NO_PLACE ? null : Number(parent),
      note: note.trim() || undefined,
    });
    if (!parsed.success) {
      create.reset();
      setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    setErrors({});
    create.mutate(parsed.data, { onSuccess: onClose, onError: (error) => setErrors(errorsFromRequest(error)) });
  };

  const { placed, rest } = partitionErrors(errors, (key) => ['name', 'kind', 'parentId', 'note'].includes(key));

  return (
    <Card
      title="Add a place"
      lead="A room, cabinet, desiccator or glovebox that holds boxes. Places can sit inside places."
      testID="add-place"
    >
      <TextField
        label="Name"
        hint="As it is signed in the lab, e.g. Lab 2.14 or Desiccator B"
        value={name}
        onChangeText={setName}
        errors={placed.name}
        testID="place-name"
      />
      <ChoiceChips
        label="Kind"
        choices={PLACE_KINDS.map((value) => ({ value, label: PLACE_KIND_LABELS[value] }))}
        value={kind}
        onChange={setKind}
        errors={placed.kind}
        testID="place-kind"
      />
      <ChoiceChips
        label="Inside"
        choices={placeChoices(places.data ?? [], 'Nothing (top level)')}
        value={parent}
        onChange={setParent}
        errors={placed.parentId}
        testID="place-parent"
      />
      <TextField label="Note" hint="Optional" value={note} onChangeText={setNote} errors={placed.note} testID="place-note" />
      <FormProblem title="Could not add the place" error={unplaced(create.error, placed, rest)} formErrors={rest} />
      <View style={styles.actions}>
        <Button title="Add place" icon="add" onPress={submit} loading={create.isPending} testID="place-save" />
        <Button title="Cancel" variant="quiet" onPress={onClose} testID="place-cancel" />
      </View>
    </Card>
  );
}

export function AddBoxCard({ onClose }: { onClose: () => void }) {
  const router = useRouter();
  const places = usePlacesQuery();
  const create = useCreateBoxMutation();
  const [name, setName] = useState('');
  const [place, setPlace] = useState(NO_PLACE);
  const [rows, setRows] = useState('9');
  const [columns, setColumns] = useState('9');
  const [rowLabels, setRowLabels] = useState<AxisLabels>('letters');
  const [columnLabels, setColumnLabels] = useState<AxisLabels>('numbers');
  const [note, setNote] = useState('');
  const [errors, setErrors] = useState<PathErrors>({});

  const input = {
    name,
    placeId: place === NO_PLACE ? null : Number(place),
    rows: wholeNumber(rows),
    columns: wholeNumber(columns),
    rowLabels,
    columnLabels,
    note: note.trim() || undefined,
  };
  const preview = BoxCreateInput.safeParse({ ...input, name: name.trim() || 'preview' });

  const submit = () => {
    const parsed = BoxCreateInput.safeParse(input);
    if (!parsed.success) {
      create.reset();
      setErrors(errorsFromIssues(parsed.error.issues));
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (box) => {
        onClose();
        router.push({ pathname: '/boxes/[code]', params: { code: box.code } });
      },
      onError: (error) => setErrors(errorsFromRequest(error)),
    });
  };

  const fields = ['name', 'placeId', 'rows', 'columns', 'rowLabels', 'columnLabels', 'note'];
  const { placed, rest } = partitionErrors(errors, (key) => fields.includes(key));

  return (
    <Card title="Add a box" lead="A box with a grid of slots. It gets its own code and label, like a sample." testID="add-box">
      <TextField
        label="Name"
        hint="What is written on it, e.g. MoS2 chips 1"
        value={name}
        onChangeText={setName}
        errors={placed.name}
        testID="box-name"
      />
      <ChoiceChips
        label="Kept in"
        choices={placeChoices(places.data ?? [], 'No place yet')}
        value={place}
        onChange={setPlace}
        errors={placed.placeId}
        testID="box-place"
      />
      <View style={styles.pair}>
        <View style={styles.half}>
          <TextField
            label="Rows"
            hint={`1 to ${BOX_MAX_ROWS}`}
            value={rows}
            onChangeText={setRows}
            inputMode="numeric"
            keyboardType="number-pad"
            errors={placed.rows}
            testID="box-rows"
          />
        </View>
        <View style={styles.half}>
          <TextField
            label="Columns"
            hint={`1 to ${BOX_MAX_COLUMNS}`}
            value={columns}
            onChangeText={setColumns}
            inputMode="numeric"
            keyboardType="number-pad"
            errors={placed.columns}
            testID="box-columns"
          />
        </View>
      </View>
      <ChoiceChips
        label="Rows are named with"
        choices={AXIS_CHOICES}
        value={rowLabels}
        onChange={setRowLabels}
        errors={placed.rowLabels}
        testID="box-row-labels"
      />
      <ChoiceChips
        label="Columns are named with"
        choices={AXIS_CHOICES}
        value={columnLabels}
        onChange={setColumnLabels}
        errors={placed.columnLabels}
        testID="box-column-labels"
      />
      {preview.success ? (
        <Text tone="muted" testID="box-slot-preview">
          {`Slots ${slotName(1, 1, rowLabels, columnLabels)} to ${slotName(preview.data.rows, preview.data.columns, rowLabels, columnLabels)}, ${preview.data.rows * preview.data.columns} in all.`}
        </Text>
      ) : null}
      <TextField label="Note" hint="Optional" value={note} onChangeText={setNote} errors={placed.note} testID="box-note" />
      <FormProblem title="Could not add the box" error={unplaced(create.error, placed, rest)} formErrors={rest} />
      <View style={styles.actions}>
        <Button title="Add box" icon="add" onPress={submit} loading={create.isPending} testID="box-save" />
        <Button title="Cancel" variant="quiet" onPress={onClose} testID="box-cancel" />
      </View>
    </Card>
  );
}

const styles = StyleSheet.create({
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  pair: { flexDirection: 'row', gap: space.lg },
  half: { flex: 1, minWidth: 0 },
});
