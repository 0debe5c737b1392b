import { useMutation } from '@tanstack/react-query';
import type { SecondFactorEnrolment } from '@shared/schemas/second-factor';
import { api } from '@/lib/api-client';

/** A new secret to enrol (its QR code and its text); it waits beside the account until a code of it confirms it. */
export function beginSecondFactor(): Promise<SecondFactorEnrolment> {
  return api.post<SecondFactorEnrolment>('/auth/second-factor/setup');
}

export function useBeginSecondFactor() {
  return useMutation({ mutationFn: beginSecondFactor });
}
