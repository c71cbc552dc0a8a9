import { useId, type InputHTMLAttributes, type ReactNode } from 'react';
import { describedBy, FieldError, FieldHint } from './field';

interface CheckboxProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'id' | 'type'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
}

export function Checkbox({ label, hint, error, className, ...rest }: CheckboxProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className={className}>
      <div className="flex items-start gap-2">
        <input
          id={id}
          type="checkbox"
          aria-invalid={error ? true : undefined}
          aria-describedby={describedBy(hint ? hintId : undefined, error ? errorId : undefined)}
          className="mt-0.5 size-5 shrink-0 accent-pine-700"
          {...rest}
        />
        <label htmlFor={id} className="text-sm font-semibold text-canvas-800">
          {label}
        </label>
      </div>
      <div className="pl-7">
        <FieldHint id={hintId}>{hint}</FieldHint>
        <FieldError id={errorId}>{error}</FieldError>
      </div>
    </div>
  );
}
