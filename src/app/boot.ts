/**
 * Start-up: decides which case the app opens with and what the shell gets from the storage and
 * offline layers. (The store layer replaces the in-memory start with the last case on the device.)
 */
import type { ComponentType } from 'preact';
import type { Case } from '../case/schema';
import { newCase } from '../case/defaults';

export interface AppSlots {
  /** case library / files menu shown in the header, provided by the storage layer */
  caseMenu?: ComponentType;
  /** status area (offline indicator, update prompt), provided by the offline layer */
  status?: ComponentType;
}

export interface BootResult {
  initialCase: Case;
  slots: AppSlots;
}

export async function boot(): Promise<BootResult> {
  return { initialCase: newCase(), slots: {} };
}
