import { useId, useState } from 'react';
import { useLabProfile } from '../api/get-lab-profile';
import { useSetMemberListing } from '../api/set-member-listing';
import { FormAlert } from '../../../components/form';

/** A member's own choice to appear (name and ORCID iD, never the address) on the lab's public page. */
export function MemberListingToggle({ slug }: { slug: string }) {
  const profile = useLabProfile(slug);
  const set = useSetMemberListing(slug);
  const hintId = useId();
  // What the member clicked shows at once; the saved value takes over when it arrives.
  const [clicked, setClicked] = useState<{ value: boolean; over: boolean | null | undefined } | null>(null);
  const listed = profile.data?.myListing;
  if (listed === null || listed === undefined) return null;
  return (
    <div className="flex flex-col gap-2 rounded-lg border border-mist bg-white p-4">
      <label className="flex items-center gap-3 text-sm font-medium">
        <input
          type="checkbox"
          className="h-4 w-4 accent-dusk"
          checked={clicked && clicked.over === listed ? clicked.value : listed}
          aria-describedby={hintId}
          onChange={(e) => {
            setClicked({ value: e.target.checked, over: listed });
            set.mutate(e.target.checked, { onError: () => setClicked(null) });
          }}
        />
        List me on the lab’s public page
      </label>
      {/* Outside the label, so the label stays short for assistive technology. */}
      <p id={hintId} className="pl-7 text-sm text-ink/70">
        Shows your name and, if you gave one on your account page, your ORCID iD. Your address is never shown. Only you can change this.
      </p>
      {set.isError ? <FormAlert tone="error">{set.error.message}</FormAlert> : null}
    </div>
  );
}
