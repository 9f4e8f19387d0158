import { Caution } from '@/components';

/** The cautions on the tech's pages (product.md), always shown, never behind a hover. */
export function TechCautions({ print = false }: { print?: boolean }) {
  return (
    <div className={print ? 'flex flex-col gap-2' : 'no-print flex flex-col gap-2'} aria-label="Cautions">
      <Caution id="disconnectBattery" compact />
      <Caution id="blockAttachments" compact />
      <Caution id="fuseRating" compact />
      <Caution id="arcingFuse" compact />
      <Caution id="backProbe" compact />
      <Caution id="expectations" compact />
    </div>
  );
}
