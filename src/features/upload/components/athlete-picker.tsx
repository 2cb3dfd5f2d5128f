import { X } from 'lucide-react';

export interface AthleteOption {
  id: string;
  name: string;
  /** Why this athlete cannot be tagged (e.g. consent missing); null when they can. */
  blockedReason: string | null;
}

interface AthletePickerProps {
  fileName: string;
  options: AthleteOption[];
  value: string[];
  onChange: (ids: string[]) => void;
  disabled?: boolean;
}

/** Chips for the tagged athletes plus a select to add one more; a clip may show several athletes. */
export function AthletePicker({ fileName, options, value, onChange, disabled }: AthletePickerProps) {
  const byId = new Map(options.map((option) => [option.id, option]));
  const available = options.filter((option) => !value.includes(option.id));

  return (
    <div className="flex flex-wrap items-center gap-1.5">
      {value.map((id) => (
        <span
          key={id}
          className="inline-flex items-center gap-1 rounded-full bg-glacier-100 py-0.5 pr-1 pl-2.5 text-xs font-medium text-glacier-800"
        >
          {byId.get(id)?.name ?? 'Unknown athlete'}
          {disabled ? null : (
            <button
              type="button"
              aria-label={`Remove ${byId.get(id)?.name ?? 'athlete'} from ${fileName}`}
              onClick={() => onChange(value.filter((v) => v !== id))}
              className="rounded-full p-0.5 hover:bg-glacier-200"
            >
              <X aria-hidden="true" className="h-3 w-3" />
            </button>
          )}
        </span>
      ))}
      {disabled ? null : (
        <select
          aria-label={`Add athlete to ${fileName}`}
          value=""
          onChange={(event) => {
            if (event.target.value) onChange([...value, event.target.value]);
          }}
          className="h-8 max-w-full rounded-md border border-granite-200 bg-white px-2 text-xs text-granite-800 focus:outline-2 focus:outline-glacier-500"
        >
          <option value="">{value.length === 0 ? 'Tag athlete…' : 'Add another…'}</option>
          {available.map((option) => (
            <option key={option.id} value={option.id} disabled={option.blockedReason !== null}>
              {option.blockedReason ? `${option.name} (${option.blockedReason})` : option.name}
            </option>
          ))}
        </select>
      )}
    </div>
  );
}
