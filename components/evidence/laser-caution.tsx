import { Notice } from '@/components/ui/notice';

/** Shown wherever a laser line is entered: the instrument's own rules come first. */
export function LaserCaution() {
  return (
    <Notice tone="warn" title="Laser caution" testID="laser-caution">
      Raman and PL lasers can damage eyes and burn thin flakes. Follow your lab’s laser-safety rules and the instrument’s
      training: interlocks closed, eyewear for the line in use, and the lowest power that gives a spectrum.
    </Notice>
  );
}
