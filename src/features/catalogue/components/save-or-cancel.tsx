import { SubmitButton } from '../../../components/form/fields';
import { Button } from '../../../components/ui/button';

/** The buttons that end a catalogue form: save, and Cancel when the form was opened over a list (`onCancel`). */
export function SaveOrCancel({ submitLabel, onCancel }: { submitLabel: string; onCancel?: () => void }) {
  return (
    <div className="flex flex-wrap gap-2">
      <SubmitButton>{submitLabel}</SubmitButton>
      {onCancel ? (
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      ) : null}
    </div>
  );
}
