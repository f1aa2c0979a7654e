import { StyleSheet, View } from 'react-native';
import { COMMON_MATERIALS, SAMPLE_KIND_LABELS, SAMPLE_KINDS, SAMPLE_STATUS_LABELS, SAMPLE_STATUSES } from '@/shared/samples';
import { space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { CheckToggle } from '@/components/ui/check-toggle';
import { ChoiceChips, MultiChoiceChips } from '@/components/ui/choice-chips';
import type { Choice } from '@/components/ui/choice-group';
import type { SampleSort, SortOrder } from '@/hooks/use-samples';
import { activeFilterCount, LAYER_BANDS, type LayerBand, type SampleListView } from './sample-list-params';

const KIND_CHOICES = SAMPLE_KINDS.map((value) => ({ value, label: SAMPLE_KIND_LABELS[value] }));
const STATUS_CHOICES = SAMPLE_STATUSES.map((value) => ({ value, label: SAMPLE_STATUS_LABELS[value] }));
const ANY = '';
const MATERIAL_CHOICES: readonly Choice<string>[] = [
  { value: ANY, label: 'Any' },
  ...COMMON_MATERIALS.map((value) => ({ value, label: value })),
];

const LAYER_CHOICES: readonly Choice<LayerBand | ''>[] = [
  { value: ANY, label: 'Any' },
  ...(Object.keys(LAYER_BANDS) as LayerBand[]).map((value) => ({ value, label: LAYER_BANDS[value].label })),
];

type SortChoice = `${SampleSort}:${SortOrder}`;

/** Phones have no table headers to click, so the orders people ask for most are offered here. */
const SORT_CHOICES: readonly Choice<SortChoice>[] = [
  { value: 'createdAt:desc', label: 'Newest first' },
  { value: 'createdAt:asc', label: 'Oldest first' },
  { value: 'updatedAt:desc', label: 'Recently changed' },
  { value: 'code:asc', label: 'Code' },
  { value: 'material:asc', label: 'Material' },
  { value: 'kind:asc', label: 'Kind' },
];

function parseSortChoice(choice: SortChoice): { sort: SampleSort; order: SortOrder } {
  const [sort, order] = choice.split(':') as [SampleSort, SortOrder];
  return { sort, order };
}

export interface SampleFiltersProps {
  view: SampleListView;
  onChange: (view: SampleListView) => void;
  /** Offer sort orders (phones); wide screens sort by the table's headers. */
  withSort: boolean;
  /** Offer "Mine only" (it needs to know who is signed in). */
  withMine: boolean;
}

/** Narrowing the sample list: by kind, status, material and owner. */
export function SampleFilters({ view, onChange, withSort, withMine }: SampleFiltersProps) {
  const sortValue = `${view.sort}:${view.order}` as SortChoice;
  const material = COMMON_MATERIALS.some((item) => item === view.material) ? view.material : view.material ? null : ANY;
  return (
    <View style={styles.filters} testID="sample-filters">
      <MultiChoiceChips
        label="Kind"
        choices={KIND_CHOICES}
        values={view.kind}
        onChange={(kind) => onChange({ ...view, kind })}
        testID="filter-kind"
      />
      <MultiChoiceChips
        label="Status"
        choices={STATUS_CHOICES}
        values={view.status}
        onChange={(status) => onChange({ ...view, status })}
        testID="filter-status"
      />
      <ChoiceChips
        label="Material"
        choices={MATERIAL_CHOICES}
        value={material}
        onChange={(next) => onChange({ ...view, material: next })}
        testID="filter-material"
      />
      <ChoiceChips
        label="Layer call"
        choices={LAYER_CHOICES}
        value={view.layers}
        onChange={(layers) => onChange({ ...view, layers })}
        testID="filter-layers"
      />
      {withMine ? (
        <CheckToggle
          label="Only my samples"
          checked={view.mine}
          onChange={(mine) => onChange({ ...view, mine })}
          testID="filter-mine"
        />
      ) : null}
      {withSort ? (
        <ChoiceChips
          label="Order"
          choices={SORT_CHOICES}
          value={SORT_CHOICES.some((choice) => choice.value === sortValue) ? sortValue : null}
          onChange={(choice) => onChange({ ...view, ...parseSortChoice(choice) })}
          testID="filter-sort"
        />
      ) : null}
      {activeFilterCount(view) > 0 ? (
        <Button
          title="Clear filters"
          variant="secondary"
          icon="close"
          onPress={() => onChange({ ...view, kind: [], status: [], material: '', mine: false, layers: '' })}
          testID="filter-clear"
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  filters: { gap: space.xl },
});
