import type { QueryClient } from '@tanstack/react-query';

type SignOutStep = (queryClient: QueryClient) => void;

const steps = new Set<SignOutStep>();

/**
 * Registers what must stop when the person signs out (the console's sync engines: nothing more may
 * go out under the ended session). A feature registers when its code loads, so the app layout can
 * run the steps without importing the feature — and sign-in and jobs need not load the console.
 */
export function onSignOut(step: SignOutStep): void {
  steps.add(step);
}

/** Runs every registered sign-out step; call it once the session has ended. */
export function runSignOutSteps(queryClient: QueryClient): void {
  for (const step of steps) step(queryClient);
}
