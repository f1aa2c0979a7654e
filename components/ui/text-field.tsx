import { forwardRef, useId, useState } from 'react';
import { StyleSheet, TextInput, View, type TextInputProps } from 'react-native';
import { radii, sizes, space, typeScale, useTheme } from '@/components/theme';
import { Text } from './text';

export interface TextFieldProps extends Omit<TextInputProps, 'style' | 'placeholderTextColor'> {
  label: string;
  /** Guidance shown under the label, e.g. the minimum password length. */
  hint?: string;
  /** Messages from form validation or the server, shown under the input. */
  errors?: readonly string[];
}

/** A labelled input: label above, hint under the label, errors under the input. */
export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField(
  { label, hint, errors = [], accessibilityLabel, editable = true, onFocus, onBlur, ...rest },
  ref,
) {
  const { colors } = useTheme();
  const [focused, setFocused] = useState(false);
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const invalid = errors.length > 0;
  const describedBy = [hint ? hintId : null, invalid ? errorId : null].filter(Boolean).join(' ');

  const borderColor = invalid ? colors.danger : focused ? colors.primary : colors.outline;

  return (
    <View style={styles.field}>
      <Text variant="label">{label}</Text>
      {hint ? (
        <Text variant="caption" tone="muted" nativeID={hintId}>
          {hint}
        </Text>
      ) : null}
      <TextInput
        ref={ref}
        accessibilityLabel={accessibilityLabel ?? label}
        aria-invalid={invalid}
        aria-describedby={describedBy || undefined}
        editable={editable}
        placeholderTextColor={colors.inkMuted}
        onFocus={(event) => {
          setFocused(true);
          onFocus?.(event);
        }}
        onBlur={(event) => {
          setFocused(false);
          onBlur?.(event);
        }}
        style={[
          styles.input,
          typeScale.body,
          {
            color: colors.ink,
            backgroundColor: editable ? colors.surface : colors.sunken,
            borderColor,
            borderWidth: focused || invalid ? sizes.focusRing - 1 : sizes.outline,
          },
        ]}
        {...rest}
      />
      {invalid ? (
        <View nativeID={errorId} accessibilityLiveRegion="polite" style={styles.errors}>
          {errors.map((message) => (
            <Text key={message} variant="caption" tone="danger">
              {message}
            </Text>
          ))}
        </View>
      ) : null}
    </View>
  );
});

const styles = StyleSheet.create({
  field: { gap: space.xs, alignSelf: 'stretch' },
  input: {
    minHeight: sizes.inputHeight,
    borderRadius: radii.md,
    paddingHorizontal: space.md,
    paddingVertical: space.sm,
    marginTop: space.xxs,
  },
  errors: { gap: space.xxs },
});
