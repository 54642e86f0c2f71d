/** The plain <input> under text, number and integer fields, styled as the rest of the app. */
import type { BaseInputTemplateProps } from '@rjsf/utils';
import { ariaDescribedByIds, getInputProps } from '@rjsf/utils';
import type { ChangeEvent } from 'react';
import { inputClass } from './input-class';

export function BaseInputTemplate(props: BaseInputTemplateProps) {
  const { id, htmlName, value, readonly, disabled, autofocus, onBlur, onFocus, onChange, onChangeOverride, options, schema, type, rawErrors, placeholder, required } = props;
  const inputProps = getInputProps(schema, type, options);
  const inputValue = value === undefined || value === null ? '' : value;
  const handleChange = ({ target }: ChangeEvent<HTMLInputElement>) => onChange(target.value === '' ? options.emptyValue : target.value);
  const invalid = (rawErrors?.length ?? 0) > 0;
  return (
    <input
      id={id}
      name={htmlName || id}
      {...inputProps}
      value={inputValue}
      placeholder={readonly ? undefined : placeholder}
      readOnly={readonly}
      disabled={disabled}
      required={required}
      autoFocus={autofocus}
      aria-invalid={invalid || undefined}
      aria-describedby={ariaDescribedByIds(id)}
      onChange={onChangeOverride ?? handleChange}
      onBlur={(e) => onBlur(id, e.target.value)}
      onFocus={(e) => onFocus(id, e.target.value)}
      className={inputClass({ invalid, readonly, large: options.large === true })}
    />
  );
}
