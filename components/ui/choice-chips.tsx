import Ionicons from '@expo/vector-icons/Ionicons';
import { Pressable, StyleSheet, View } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import type { Choice } from './choice-group';
import { Text } from './text';

interface ChipProps {
  label: string;
  selected: boolean;
  /** radio: one of a set; checkbox: any number of a set. */
  role: 'radio' | 'checkbox';
  large: boolean;
  disabled: boolean;
  onPress: () => void;
  testID?: string;
}

/** A pill that reads as pressed when chosen: a tick, the primary outline and a soft fill. */
function Chip({ label, selected, role, large, disabled, onPress, testID }: ChipProps) {
  const { colors } = useTheme();
  return (
    <Pressable
      accessibilityRole={role}
      accessibilityLabel={label}
      accessibilityState={{ checked: selected, disabled }}
      disabled={disabled}
      onPress={onPress}
      testID={testID}
      style={({ pressed }) => [
        styles.chip,
        large && styles.large,
        {
          borderColor: selected ? colors.primary : colors.outline,
          borderWidth: selected ? sizes.focusRing - 1 : sizes.hairline,
          backgroundColor: selected ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
        },
        disabled && styles.disabled,
      ]}
    >
      {selected ? <Ionicons name="checkmark" size={sizes.iconSmall} color={colors.onPrimarySoft} /> : null}
      <Text variant="label" style={{ color: selected ? colors.onPrimarySoft : colors.ink }}>
        {label}
      </Text>
    </Pressable>
  );
}

interface ChipGroupBase<V extends string> {
  label: string;
  /** Hide the visible label when a heading nearby already says it (it stays for screen readers). */
  hideLabel?: boolean;
  choices: readonly Choice<V>[];
  errors?: readonly string[];
  disabled?: boolean;
  /** Taller chips for the main choice of a form (e.g. the step type). */
  large?: boolean;
  /** Each chip gets `<testID>-<value>`. */
  testID?: string;
}

export interface ChoiceChipsProps<V extends string> extends ChipGroupBase<V> {
  value: V | null;
  onChange: (value: V) => void;
}

/** One choice from a short set, as a wrapping row of pills: quicker to scan than radio cards. */
export function ChoiceChips<V extends string>({ value, onChange, ...group }: ChoiceChipsProps<V>) {
  return <ChipGroup {...group} role="radio" isSelected={(choice) => choice === value} onPress={onChange} />;
}

export interface MultiChoiceChipsProps<V extends string> extends ChipGroupBase<V> {
  values: readonly V[];
  onChange: (values: V[]) => void;
}

/** Any number of choices (e.g. filters); none chosen means "any". */
export function MultiChoiceChips<V extends string>({ values, onChange, ...group }: MultiChoiceChipsProps<V>) {
  const toggle = (choice: V) =>
    onChange(values.includes(choice) ? values.filter((item) => item !== choice) : [...values, choice]);
  return <ChipGroup {...group} role="checkbox" isSelected={(choice) => values.includes(choice)} onPress={toggle} />;
}

interface ChipGroupProps<V extends string> extends ChipGroupBase<V> {
  role: 'radio' | 'checkbox';
  isSelected: (value: V) => boolean;
  onPress: (value: V) => void;
}

function ChipGroup<V extends string>({
  label,
  hideLabel = false,
  choices,
  errors = [],
  disabled = false,
  large = false,
  testID,
  role,
  isSelected,
  onPress,
}: ChipGroupProps<V>) {
  return (
    <View
      style={styles.group}
      accessibilityRole={role === 'radio' ? 'radiogroup' : undefined}
      role={role === 'radio' ? undefined : 'group'}
      accessibilityLabel={label}
      testID={testID}
    >
      {hideLabel ? null : <Text variant="label">{label}</Text>}
      <View style={styles.chips}>
        {choices.map((choice) => (
          <Chip
            key={choice.value}
            label={choice.label}
            selected={isSelected(choice.value)}
            role={role}
            large={large}
            disabled={disabled}
            onPress={() => onPress(choice.value)}
            testID={testID ? `${testID}-${choice.value}` : undefined}
          />
        ))}
      </View>
      {errors.map((message) => (
        <Text key={message} variant="caption" tone="danger">
          {message}
        </Text>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  group: { gap: space.sm },
  chips: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  chip: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.xs,
    paddingHorizontal: space.lg,
    borderRadius: radii.pill,
  },
  large: { minHeight: sizes.inputHeight + space.md, paddingHorizontal: space.xl, borderRadius: radii.md },
  disabled: { opacity: 0.5 },
});
