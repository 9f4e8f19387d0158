// Wirewalk's shared components. Import from '@/components'.
export { Button, ButtonLink, buttonClass, type ButtonTone } from './Button';
export { TextField, SelectField, TextAreaField, CheckboxField, type SelectOption } from './fields';
export { FormError } from './FormError';
export { Card, Panel } from './Panel';
export { PageHeader } from './PageHeader';
export { EmptyState } from './EmptyState';
export { Spinner } from './Spinner';
export { ProgressBar, Loading } from './ProgressBar';
export { Caution, CautionList } from './Caution';
export { cautions, cautionSets, type CautionId, type CautionText } from './cautions';
export { ReadingBadge, readingText, isInRange, formatValue, formatRange, type ExpectedRange } from './ReadingBadge';
export { WireSwatch, swatchPaint } from './WireSwatch';
export { ConfirmDialog } from './ConfirmDialog';
export { ToastProvider, useToast, type NoticeTone } from './Toast';
export { ModeSwitch, ModeToggleButton } from './ModeSwitch';
export { Tag } from './Tag';
export { Modal } from './Modal';
