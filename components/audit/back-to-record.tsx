import { sampleHref } from '@/components/samples/sample-list-params';
import { TextLink } from '@/components/ui/text-link';
import { useBreakpoints } from '@/hooks/use-breakpoints';

/** "← DV-…": back to the record a lens design, lineage picture or audit belongs to. */
export function BackToRecord({ code }: { code: string }) {
  const { isWide } = useBreakpoints();
  return (
    <TextLink href={sampleHref(code, { wide: isWide })} testID="back-to-record">
      {`← ${code}`}
    </TextLink>
  );
}
