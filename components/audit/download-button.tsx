import { Linking } from 'react-native';
import { Button, type ButtonVariant, type IconName } from '@/components/ui/button';

export interface DownloadButtonProps {
  /** Same-origin address of the file; the session cookie goes with it. */
  href: string;
  /** Name the browser saves the file under (web only). */
  fileName: string;
  title: string;
  icon?: IconName;
  variant?: ButtonVariant;
  disabled?: boolean;
  testID?: string;
}

/** Outside a browser the system opens the file's address and offers to keep it. */
export function DownloadButton({
  href,
  title,
  icon = 'download-outline',
  variant = 'secondary',
  disabled,
  testID,
}: DownloadButtonProps) {
  return (
    <Button
      title={title}
      icon={icon}
      variant={variant}
      disabled={disabled}
      onPress={() => void Linking.openURL(href)}
      testID={testID}
    />
  );
}
