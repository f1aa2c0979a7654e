import Ionicons from '@expo/vector-icons/Ionicons';
import { Pressable, StyleSheet } from 'react-native';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { Text } from './text';

export interface CheckToggleProps {
  label: string;
  checked: boolean;
  onChange: (checked: boolean) => void;
  disabled?: boolean;
  testID?: string;
}

/** A checkbox with its label inside one full-height target, so a gloved tap anywhere on it counts. */
export function CheckToggle({ label, checked, onChange, disabled = false, testID }: CheckToggleProps) {
  const { colors } = useTheme();
  return (
    <Pressable
      accessibilityRole="checkbox"
      accessibilityLabel={label}
      accessibilityState={{ checked, disabled }}
      disabled={disabled}
      onPress={() => onChange(!checked)}
      testID={testID}
      style={({ pressed }) => [
        styles.toggle,
        { backgroundColor: pressed ? colors.sunken : 'transparent' },
        disabled && styles.disabled,
      ]}
    >
      <Ionicons
        name={checked ? 'checkbox' : 'square-outline'}
        size={sizes.icon}
        color={checked ? colors.primary : colors.outline}
      />
      <Text variant="label">{label}</Text>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  toggle: {
    minHeight: sizes.touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.sm,
    borderRadius: radii.md,
    alignSelf: 'flex-start',
  },
  disabled: { opacity: 0.5 },
});
