import { signal } from '@preact/signals';

/** Whether the printable report is open; its code (ReportView.tsx) is loaded when it first opens. */
export const reportOpen = signal(false);
