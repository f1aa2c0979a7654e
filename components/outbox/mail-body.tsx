import { Link } from 'expo-router';
import { useTheme } from '@/components/theme';
import { Text } from '@/components/ui/text';

const URL_PATTERN = /(https?:\/\/[^\s<>"')\]]+)/g;

/** Splits plain text into prose and web addresses. */
export function splitLinks(text: string): { text: string; isLink: boolean }[] {
  return text
    .split(URL_PATTERN)
    .filter((part) => part.length > 0)
    .map((part) => ({ text: part, isLink: /^https?:\/\//.test(part) }));
}

/** The plain-text body of a captured e-mail, line breaks kept, links openable (in a new tab on the web). */
export function MailBody({ text }: { text: string }) {
  const { colors } = useTheme();
  return (
    <Text selectable testID="mail-body">
      {splitLinks(text).map((part, index) =>
        part.isLink ? (
          <Link
            key={index}
            href={part.text}
            target="_blank"
            rel="noopener noreferrer"
            style={{ color: colors.primary, textDecorationLine: 'underline' }}
          >
            {part.text}
          </Link>
        ) : (
          part.text
        ),
      )}
    </Text>
  );
}
