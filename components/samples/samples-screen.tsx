import { Link, useRouter } from 'expo-router';
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { ScrollView, StyleSheet, View } from 'react-native';
import { ListPrintLabels } from '@/components/labels/list-print-labels';
import { PrintLabelsButton } from '@/components/labels/print-labels';
import { SelectableSamples } from '@/components/labels/selectable-samples';
import { sizes, space } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { Screen } from '@/components/ui/screen';
import { EmptyState, ErrorState, LoadingState } from '@/components/ui/state-views';
import { Text } from '@/components/ui/text';
import { TextField } from '@/components/ui/text-field';
import { TextLink } from '@/components/ui/text-link';
import { useDebouncedValue } from '@/components/ui/use-debounced-value';
import { describeError } from '@/hooks/api-client';
import { useBreakpoints } from '@/hooks/use-breakpoints';
import { LABEL_BATCH_MAX } from '@/hooks/use-labels';
import { useSampleListQuery } from '@/hooks/use-samples';
import { useSessionQuery } from '@/hooks/use-session';
import { SampleCard } from './sample-card';
import { SampleDetail } from './sample-detail';
import { SampleFilters } from './sample-filters';
import { activeFilterCount, filtersFor, sampleHref, viewParams, type SampleListView } from './sample-list-params';
import { SampleTable } from './sample-table';
import { canWriteSamples } from './writers-only';

const TITLE = 'Samples';
const LEAD = 'Every crystal, chip, flake, film, stack and device in the lab, and where each came from.';

/** The filter column on wide screens: narrower than the navigation column beside it. */
const FILTER_PANE_WIDTH = sizes.navColumnWidth - space.xxxl;

export interface SamplesScreenProps {
  view: SampleListView;
  /** The sample shown beside the list (wide) or instead of it (narrower screens). */
  selectedCode: string | null;
}

export function SamplesScreen({ view, selectedCode }: SamplesScreenProps) {
  const { isWide } = useBreakpoints();
  // Phones and tablets: the chosen sample replaces the list, and the back button returns to it.
  if (!isWide && selectedCode) return <SamplePage code={selectedCode} view={view} />;
  return <SampleList view={view} selectedCode={selectedCode} wide={isWide} />;
}

function SamplePage({ code, view }: { code: string; view: SampleListView }) {
  const back = (
    <TextLink href={{ pathname: '/samples', params: definedParams(viewParams(view)) }} testID="samples-back">
      ← All samples
    </TextLink>
  );
  // The record's own card shows the code large, so the heading only names the place.
  return (
    <Screen title="Sample" above={back} testID="sample-screen">
      <SampleDetail code={code} />
    </Screen>
  );
}

function SampleList({ view, selectedCode, wide: isWide }: SamplesScreenProps & { wide: boolean }) {
  const session = useSessionQuery();
  const router = useRouter();
  const canWrite = canWriteSamples(session.data);
  const filters = filtersFor(view, session.data?.id);
  const list = useSampleListQuery(filters);
  // Choosing samples one by one for a sheet of labels; null when not choosing.
  const [chosen, setChosen] = useState<string[] | null>(null);

  const setView = (next: SampleListView) => router.setParams(viewParams(next));
  const hrefFor = (code: string) => sampleHref(code, { wide: isWide, view });
  const toggle = (code: string) =>
    setChosen((current) =>
      current === null
        ? [code]
        : current.includes(code)
          ? current.filter((other) => other !== code)
          : current.length < LABEL_BATCH_MAX
            ? [...current, code]
            : current,
    );

  const actions = (
    <>
      {canWrite ? <WriterActions /> : null}
      {chosen === null ? <ListPrintLabels filters={filters} onChooseSamples={() => setChosen([])} /> : null}
    </>
  );
  const search = <SearchField view={view} onChange={setView} />;
  const selection =
    chosen === null ? null : (
      <SelectionBar
        chosen={chosen}
        shown={list.data?.samples.map((sample) => sample.code) ?? []}
        onChange={setChosen}
        onDone={() => setChosen(null)}
      />
    );
  const body = (
    <ListBody
      list={list}
      view={view}
      canWrite={canWrite}
      onClearFilters={() => setView({ ...view, kind: [], status: [], material: '', mine: false, q: '' })}
      renderRows={(samples) =>
        chosen !== null ? (
          <SelectableSamples samples={samples} chosen={chosen} onToggle={toggle} />
        ) : isWide ? (
          <SampleTable
            samples={samples}
            sort={view.sort}
            order={view.order}
            onSort={(sort, order) => setView({ ...view, sort, order })}
            selectedCode={selectedCode}
            hrefFor={hrefFor}
          />
        ) : (
          <View style={styles.cards} role="list" accessibilityLabel="Samples">
            {samples.map((sample) => (
              <View key={sample.code} role="listitem">
                <SampleCard sample={sample} href={hrefFor(sample.code)} />
              </View>
            ))}
          </View>
        )
      }
    />
  );

  if (!isWide) {
    return (
      <Screen title={TITLE} lead={LEAD} actions={actions} testID="samples-screen">
        {search}
        <PhoneFilters view={view} onChange={setView} withMine={session.data !== undefined} />
        {selection}
        {body}
      </Screen>
    );
  }

  return (
    <Screen title={TITLE} lead={LEAD} actions={actions} width="wide" scroll={false} testID="samples-screen">
      <View style={styles.split}>
        <ScrollView style={styles.filterPane} contentContainerStyle={styles.paneContent}>
          <SampleFilters view={view} onChange={setView} withSort={false} withMine={session.data !== undefined} />
        </ScrollView>
        <ScrollView style={styles.listPane} contentContainerStyle={styles.paneContent} testID="sample-list-pane">
          {search}
          {selection}
          {body}
        </ScrollView>
        <ScrollView style={styles.detailPane} contentContainerStyle={styles.paneContent} testID="sample-detail-pane">
          {selectedCode ? (
            <SampleDetail key={selectedCode} code={selectedCode} />
          ) : (
            <EmptyState icon="layers-outline" title="No sample selected" testID="sample-none-selected">
              Choose a sample in the list to see its details, ancestry and history.
            </EmptyState>
          )}
        </ScrollView>
      </View>
    </Screen>
  );
}

function definedParams(params: Record<string, string | undefined>): Record<string, string> {
  return Object.fromEntries(Object.entries(params).filter((entry): entry is [string, string] => entry[1] !== undefined));
}

function WriterActions() {
  return (
    <>
      <Link href="/samples/new" asChild>
        <Button title="New sample" icon="add" testID="new-sample" />
      </Link>
      <Link href="/steps/new" asChild>
        <Button title="Log a step" icon="git-merge-outline" variant="secondary" testID="log-step" />
      </Link>
    </>
  );
}

interface SelectionBarProps {
  chosen: string[];
  /** The codes the list shows now, for "choose all shown". */
  shown: string[];
  onChange: (chosen: string[]) => void;
  onDone: () => void;
}

/** While choosing samples for labels: how many are chosen, and printing them. */
function SelectionBar({ chosen, shown, onChange, onDone }: SelectionBarProps) {
  const count = chosen.length;
  return (
    <Notice
      tone="info"
      title={count ? `${count} ${count === 1 ? 'sample' : 'samples'} chosen` : 'Choose the samples to print labels for'}
      testID="sample-selection"
      action={
        <>
          <PrintLabelsButton
            target={{ kind: 'samples', codes: chosen }}
            what={`Labels for the ${count === 1 ? 'sample' : `${count} samples`} you chose.`}
            title={count ? `Print ${count} ${count === 1 ? 'label' : 'labels'}` : 'Print labels'}
            variant="primary"
            disabled={count === 0}
            testID="selection-print"
          />
          <Button
            title="Choose all shown"
            variant="secondary"
            onPress={() => onChange([...new Set([...chosen, ...shown])].slice(0, LABEL_BATCH_MAX))}
            testID="selection-all"
          />
          <Button title="Done" variant="quiet" onPress={onDone} testID="selection-done" />
        </>
      }
    >
      {`Tap samples in the list to choose them (up to ${LABEL_BATCH_MAX}).`}
    </Notice>
  );
}

/** Search as you type; the address is updated once typing pauses. */
function SearchField({ view, onChange }: { view: SampleListView; onChange: (view: SampleListView) => void }) {
  const [text, setText] = useState(view.q);
  const settled = useDebouncedValue(text);
  const pushed = useRef(view.q);

  useEffect(() => {
    if (settled === pushed.current) return;
    pushed.current = settled;
    onChange({ ...view, q: settled });
  }, [settled, view, onChange]);

  // The address changed by other means (back button, "Clear"): show what is searched now.
  useEffect(() => {
    if (view.q === pushed.current) return;
    pushed.current = view.q;
    setText(view.q);
  }, [view.q]);

  return (
    <TextField
      label="Search"
      hint="Code, name or note"
      value={text}
      onChangeText={setText}
      autoCapitalize="none"
      autoCorrect={false}
      autoComplete="off"
      inputMode="search"
      returnKeyType="search"
      testID="sample-search"
    />
  );
}

function PhoneFilters({
  view,
  onChange,
  withMine,
}: {
  view: SampleListView;
  onChange: (view: SampleListView) => void;
  withMine: boolean;
}) {
  const [open, setOpen] = useState(false);
  const count = activeFilterCount(view);
  return (
    <View style={styles.phoneFilters}>
      <Button
        title={open ? 'Hide filters' : count ? `Filters (${count})` : 'Filters and order'}
        variant="secondary"
        icon={open ? 'chevron-up' : 'options-outline'}
        onPress={() => setOpen(!open)}
        aria-expanded={open}
        testID="sample-filters-toggle"
      />
      {open ? <SampleFilters view={view} onChange={onChange} withSort withMine={withMine} /> : null}
    </View>
  );
}

interface ListBodyProps {
  list: ReturnType<typeof useSampleListQuery>;
  view: SampleListView;
  canWrite: boolean;
  onClearFilters: () => void;
  renderRows: (samples: NonNullable<ReturnType<typeof useSampleListQuery>['data']>['samples']) => ReactNode;
}

/** Loading, failed, empty (nothing yet, or nothing matching) and the rows with "Load more". */
function ListBody({ list, view, canWrite, onClearFilters, renderRows }: ListBodyProps) {
  if (!list.data) {
    return list.isError ? (
      <ErrorState
        title="Could not load the samples"
        error={list.error}
        onRetry={() => void list.refetch()}
        retrying={list.isFetching}
      />
    ) : (
      <LoadingState label="Loading samples…" />
    );
  }

  const { samples, total } = list.data;
  const narrowed = activeFilterCount(view) > 0 || view.q.trim() !== '';

  if (samples.length === 0) {
    return narrowed ? (
      <EmptyState
        icon="search-outline"
        title="No samples match"
        testID="samples-no-match"
        action={<Button title="Clear search and filters" variant="secondary" onPress={onClearFilters} />}
      >
        Try fewer filters, or check the code against the label.
      </EmptyState>
    ) : (
      <EmptyState
        icon="layers-outline"
        title={canWrite ? 'No samples yet — register a source crystal' : 'No samples yet'}
        testID="samples-empty"
        action={
          canWrite ? (
            <Link href={{ pathname: '/samples/new', params: { kind: 'crystal' } }} asChild>
              <Button title="Register a source crystal" icon="add" testID="samples-empty-register" />
            </Link>
          ) : null
        }
      >
        {canWrite
          ? 'Everything in Flakeline descends from something registered here: a bulk crystal, a substrate or a bought film.'
          : 'When researchers register crystals and log their steps, the samples appear here.'}
      </EmptyState>
    );
  }

  return (
    <View style={styles.results}>
      <Text variant="caption" tone="muted" testID="samples-count" accessibilityLiveRegion="polite">
        {samples.length < total
          ? `Showing ${samples.length} of ${total} samples`
          : `${total} ${total === 1 ? 'sample' : 'samples'}`}
      </Text>
      {renderRows(samples)}
      {list.isFetchNextPageError ? (
        <Notice tone="error" title="Could not load more samples">
          {describeError(list.error)}
        </Notice>
      ) : null}
      {list.hasNextPage ? (
        <Button
          title="Load more"
          variant="secondary"
          icon="chevron-down"
          block
          onPress={() => void list.fetchNextPage()}
          loading={list.isFetchingNextPage}
          testID="samples-load-more"
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  // A zero basis keeps the panes' content out of the page height, so each pane scrolls on its own.
  split: { flexGrow: 1, flexShrink: 1, flexBasis: 0, minHeight: 0, flexDirection: 'row', gap: space.xl },
  filterPane: { width: FILTER_PANE_WIDTH, flexGrow: 0, flexShrink: 0 },
  // The table gets a little more room than the record: its codes must never be cut off.
  listPane: { flexGrow: 1.3, flexShrink: 1, flexBasis: 0, minWidth: 0 },
  detailPane: { flexGrow: 1, flexShrink: 1, flexBasis: 0, minWidth: 0 },
  paneContent: { gap: space.lg, paddingBottom: space.xl },
  phoneFilters: { gap: space.lg },
  cards: { gap: space.sm },
  results: { gap: space.md },
});
