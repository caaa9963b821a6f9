import { Controller, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { ScoreScale, type ScoreScaleProps } from './ScoreScale';

// Apart from ScoreScale so that a screen showing a scale outside a form (the athlete's home) does not
// load the form library with it (a fast first load on a slow phone).
/** A ScoreScale bound to a react-hook-form field. */
export function ScoreField<T extends FieldValues>({
  control,
  name,
  ...scale
}: Omit<ScoreScaleProps, 'value' | 'onChange' | 'onBlur'> & { control: Control<T, any, any>; name: FieldPath<T> }) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field }) => <ScoreScale {...scale} value={field.value} onChange={field.onChange} onBlur={field.onBlur} />}
    />
  );
}
