import { Search } from 'lucide-react';
import type { AgeGroupDto } from '@shared/schemas/athlete.schema';

interface AthleteFiltersProps {
  search: string;
  onSearchChange: (value: string) => void;
  ageGroupId: string;
  onAgeGroupChange: (value: string) => void;
  ageGroups: AgeGroupDto[];
}

export function AthleteFilters({
  search,
  onSearchChange,
  ageGroupId,
  onAgeGroupChange,
  ageGroups,
}: AthleteFiltersProps) {
  return (
    <div role="search" className="mb-4 flex flex-wrap items-end gap-3">
      <label className="flex-1 basis-64">
        <span className="mb-1 block text-sm font-medium text-granite-800">Search athletes</span>
        <span className="relative block">
          <Search aria-hidden="true" className="absolute top-2.5 left-3 h-5 w-5 text-granite-400" />
          <input
            type="search"
            value={search}
            onChange={(event) => onSearchChange(event.target.value)}
            placeholder="First or last name"
            className="h-10 w-full rounded-md border border-granite-200 bg-white pr-3 pl-10 text-sm focus:outline-2 focus:outline-glacier-500"
          />
        </span>
      </label>
      <label className="basis-48">
        <span className="mb-1 block text-sm font-medium text-granite-800">Age group</span>
        <select
          value={ageGroupId}
          onChange={(event) => onAgeGroupChange(event.target.value)}
          className="h-10 w-full rounded-md border border-granite-200 bg-white px-3 text-sm focus:outline-2 focus:outline-glacier-500"
        >
          <option value="">All groups</option>
          {ageGroups.map((group) => (
            <option key={group.id} value={group.id}>
              {group.name}
            </option>
          ))}
        </select>
      </label>
    </div>
  );
}
