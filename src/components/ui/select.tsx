import { useId, type ReactNode, type SelectHTMLAttributes } from 'react';
import { controlClasses, describedBy, FieldError, FieldHint, FieldLabel } from './field';

export interface SelectOption {
  value: string;
  label: string;
}

interface SelectProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'id'> {
  label: ReactNode;
  options: readonly SelectOption[];
  hint?: ReactNode;
  error?: string;
  hideLabel?: boolean;
  /** Text of an empty first option, when nothing is chosen yet. */
  placeholder?: string;
}

export function Select({ label, options, hint, error, hideLabel, placeholder, className, ...rest }: SelectProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  return (
    <div className={className}>
      <FieldLabel htmlFor={id} hidden={hideLabel}>
        {label}
      </FieldLabel>
      <select
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(hint ? hintId : undefined, error ? errorId : undefined)}
        className={controlClasses(Boolean(error), 'pr-8')}
        {...rest}
      >
        {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      <FieldHint id={hintId}>{hint}</FieldHint>
      <FieldError id={errorId}>{error}</FieldError>
    </div>
  );
}
