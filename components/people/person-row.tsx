import { Link } from 'expo-router';
import { Pressable, StyleSheet, View } from 'react-native';
import type { User } from '@/shared/schemas/user';
import { radii, sizes, space, useTheme } from '@/components/theme';
import { RoleBadge, StatusPill } from '@/components/ui/badges';
import { Text } from '@/components/ui/text';

export interface PersonRowProps {
  person: User;
  selected: boolean;
  isYou: boolean;
}

/**
 * One person in the list; a link so the selection lives in the address and the back button works.
 * Under <Link asChild> the Pressable takes only a flat style, so an inner view draws the card.
 */
export function PersonRow({ person, selected, isYou }: PersonRowProps) {
  const { colors } = useTheme();
  return (
    <Link href={{ pathname: '/people', params: { person: String(person.id) } }} asChild>
      <Pressable testID={`person-row-${person.email}`} aria-current={selected ? 'true' : undefined} style={styles.target}>
        {({ pressed }) => (
          <View
            style={[
              styles.row,
              {
                backgroundColor: pressed ? colors.sunken : colors.surface,
                borderColor: selected ? colors.primary : colors.hairline,
                borderWidth: selected ? sizes.focusRing - 1 : sizes.hairline,
              },
            ]}
          >
            <View style={styles.text}>
              <Text variant="label" numberOfLines={1} tone={selected ? 'primary' : 'default'}>
                {isYou ? `${person.displayName} (you)` : person.displayName}
              </Text>
              <Text variant="caption" tone="muted" numberOfLines={1}>
                {person.email}
              </Text>
            </View>
            <View style={styles.badges}>
              <RoleBadge role={person.role} />
              <StatusPill status={person.status} />
            </View>
          </View>
        )}
      </Pressable>
    </Link>
  );
}

const styles = StyleSheet.create({
  target: { minHeight: sizes.touchTarget },
  row: {
    minHeight: sizes.touchTarget,
    gap: space.sm,
    paddingHorizontal: space.lg,
    paddingVertical: space.md,
    borderRadius: radii.md,
  },
  text: { gap: space.xxs },
  badges: { flexDirection: 'row', flexWrap: 'wrap', gap: space.xs },
});
