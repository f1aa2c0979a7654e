import type { ReactNode } from 'react';
import { Wordmark } from '@/components/brand/wordmark';
import { Card } from '@/components/ui/card';
import { Screen } from '@/components/ui/screen';

export interface PublicScreenProps {
  title: string;
  lead?: string;
  testID?: string;
  children: ReactNode;
}

/** The frame of the signed-out screens: wordmark and tagline above one card. */
export function PublicScreen({ title, lead, testID, children }: PublicScreenProps) {
  return (
    <Screen title={title} lead={lead} width="narrow" centered above={<Wordmark size="large" showTagline />} testID={testID}>
      <Card>{children}</Card>
    </Screen>
  );
}
