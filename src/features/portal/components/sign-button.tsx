import { FormMessage } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { errorMessage } from '@/lib/api';
import { useStartSigning } from '../api/start-signing';

/** "Read and sign": asks for a fresh signing link, then opens the signing page. */
export function SignButton({ signUrl, size = 'md', className }: { signUrl: string; size?: 'sm' | 'md'; className?: string }) {
  const start = useStartSigning();
  return (
    <span className={className}>
      <Button
        size={size}
        className="w-full sm:w-auto"
        isLoading={start.isPending}
        onClick={() => start.mutate(signUrl, { onSuccess: (r) => window.location.assign(r.url) })}
      >
        Read and sign
      </Button>
      {start.isError ? (
        <FormMessage message={errorMessage(start.error)} />
      ) : null}
    </span>
  );
}
