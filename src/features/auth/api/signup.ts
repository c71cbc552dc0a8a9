import { useMutation } from '@tanstack/react-query';
import type { SignupAccepted, SignupRequest } from '@shared/schemas/auth';
import { api } from '@/lib/api';

/** Asks for a company: the answer is the same for every address, and the e-mail has the link. */
export const signup = (body: SignupRequest) => api.post<SignupAccepted>('/api/auth/signup', body);

export function useSignup() {
  return useMutation({ mutationFn: signup });
}
