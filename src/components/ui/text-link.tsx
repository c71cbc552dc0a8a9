import { Link, type LinkProps } from 'react-router';
import { cn } from '@/lib/cn';

export const linkClasses = 'font-semibold text-pine-700 underline hover:text-pine-900';

export function TextLink({ className, ...rest }: LinkProps) {
  return <Link className={cn(linkClasses, className)} {...rest} />;
}
