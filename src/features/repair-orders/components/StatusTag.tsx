import { orderStatusLabels, type OrderStatus } from '@shared/api/orders';
import { Tag } from '@/components';

export function StatusTag({ status }: { status: OrderStatus }) {
  return <Tag strong={status === 'ready'}>{orderStatusLabels[status]}</Tag>;
}

/** Stalled: in words and with a mark, never colour alone. */
export function StalledTag({ minutes }: { minutes: number }) {
  return (
    <span className="inline-flex items-center gap-1 rounded-control border-2 border-caution-rule bg-caution-soft px-2 py-0.5 text-sm font-bold text-caution whitespace-nowrap">
      <span aria-hidden="true">⚠</span> Stalled · {(minutes / 60).toFixed(1)} h diagnosis
    </span>
  );
}

export const hours = (minutes: number) => `${(minutes / 60).toFixed(1)} h`;
