import { StyleSheet, TextInput, View } from 'react-native';
import { radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Button } from '@/components/ui/button';
import { Text } from '@/components/ui/text';

export interface StepperProps {
  label: string;
  value: number;
  onChange: (value: number) => void;
  min: number;
  max: number;
  /** Each button gets `<testID>-minus` / `-plus`, the number `<testID>-value`. */
  testID: string;
}

/** A whole number set with two big buttons (gloves), or typed on the number pad. */
export function Stepper({ label, value, onChange, min, max, testID }: StepperProps) {
  const { colors } = useTheme();
  const clamp = (next: number) => Math.min(max, Math.max(min, next));
  return (
    <View style={styles.field}>
      <Text variant="label">{label}</Text>
      <View style={styles.row}>
        <Button
          title="−"
          accessibilityLabel={`One fewer: ${label}`}
          variant="secondary"
          disabled={value <= min}
          onPress={() => onChange(clamp(value - 1))}
          testID={`${testID}-minus`}
        />
        <TextInput
          accessibilityLabel={label}
          value={String(value)}
          onChangeText={(text) => {
            const next = Number.parseInt(text.replace(/\D/g, ''), 10);
            if (Number.isFinite(next)) onChange(clamp(next));
          }}
          inputMode="numeric"
          keyboardType="number-pad"
          selectTextOnFocus
          style={[
            styles.value,
            typeScale.heading,
            { color: colors.ink, borderColor: colors.outline, backgroundColor: colors.surface },
          ]}
          testID={`${testID}-value`}
        />
        <Button
          title="+"
          accessibilityLabel={`One more: ${label}`}
          variant="secondary"
          disabled={value >= max}
          onPress={() => onChange(clamp(value + 1))}
          testID={`${testID}-plus`}
        />
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  field: { gap: space.xs },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  value: {
    minHeight: sizes.touchTarget,
    width: sizes.touchTarget * 2,
    textAlign: 'center',
    borderWidth: sizes.outline,
    borderRadius: radii.md,
  },
});
