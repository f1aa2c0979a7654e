import Ionicons from '@expo/vector-icons/Ionicons';
import { Pressable, StyleSheet, View } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from './text';

export interface Choice<V extends string> {
  value: V;
  label: string;
  /** One line under the label, e.g. what a role may do. */
  description?: string;
}

export interface ChoiceGroupProps<V extends string> {
  label: string;
  choices: readonly Choice<V>[];
  value: V | null;
  onChange: (value: V) => void;
  errors?: readonly string[];
  disabled?: boolean;
  testID?: string;
}

/** Radio buttons as large cards: easy to hit with gloves, and the whole choice is readable. */
export function ChoiceGroup<V extends string>({
  label,
  choices,
  value,
  onChange,
  errors = [],
  disabled = false,
  testID,
}: ChoiceGroupProps<V>) {
  const { colors } = useTheme();
  return (
    <View style={styles.group} accessibilityRole="radiogroup" accessibilityLabel={label} testID={testID}>
      <Text variant="label">{label}</Text>
      <View style={styles.choices}>
        {choices.map((choice) => {
          const selected = choice.value === value;
          return (
            <Pressable
              key={choice.value}
              accessibilityRole="radio"
              accessibilityLabel={choice.label}
              accessibilityState={{ checked: selected, disabled }}
              disabled={disabled}
              onPress={() => onChange(choice.value)}
              style={({ pressed }) => [
                styles.choice,
                {
                  borderColor: selected ? colors.primary : colors.hairline,
                  borderWidth: selected ? sizes.focusRing - 1 : sizes.hairline,
                  backgroundColor: selected ? colors.primarySoft : pressed ? colors.sunken : colors.surface,
                },
                disabled && styles.disabled,
              ]}
            >
              <Ionicons
                name={selected ? 'radio-button-on' : 'radio-button-off'}
                size={sizes.icon}
                color={selected ? colors.primary : colors.outline}
              />
              <View style={styles.choiceText}>
                <Text variant="label" style={selected ? { color: colors.onPrimarySoft } : null}>
                  {choice.label}
                </Text>
                {choice.description ? (
                  <Text variant="caption" tone="muted" style={selected ? { color: colors.onPrimarySoft } : null}>
                    {choice.description}
                  </Text>
                ) : null}
              </View>
            </Pressable>
          );
        })}
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
  choices: { gap: space.sm },
  choice: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    borderRadius: radii.md,
  },
  choiceText: { flex: 1, gap: space.xxs },
  disabled: { opacity: 0.5 },
});
