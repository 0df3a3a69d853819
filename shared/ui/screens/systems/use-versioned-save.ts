/**
 * Saving a versioned resource (system, scenario, recipe) from its editor: create when new, else
 * update on top of the version the form started from (the server answers 409 if someone saved a
 * newer one). After a save the form is reset to what was stored, and a new record's address
 * replaces /new.
 */
import { useRouter } from 'expo-router';
import { useState } from 'react';
import type { createResourceHooks, ResourceVersionOf, SaveRequest } from '@/shared/ui/api/versioned-resource';

type ResourceHooks<D, I> = ReturnType<typeof createResourceHooks<D, I>>;

export function useVersionedSave<D, I = D>(
  hooks: ResourceHooks<D, I>,
  labId: string,
  record: ResourceVersionOf<D> | null,
  basePath: string,
  onSaved: (saved: ResourceVersionOf<D>) => void,
) {
  const router = useRouter();
  const create = hooks.useCreate(labId);
  const update = hooks.useUpdate(labId, record?.id ?? '');
  const [savedVersion, setSavedVersion] = useState<number | null>(null);
  const versions = hooks.useVersions(labId, record?.id ?? '');
  const useVersion = (v: number | null) => hooks.useVersion(labId, record?.id ?? '', v);

  const save = (body: SaveRequest<I>) => {
    const done = (saved: ResourceVersionOf<D>) => {
      setSavedVersion(saved.version.version);
      onSaved(saved);
      if (!record) router.replace(`${basePath}/${saved.id}`);
    };
    if (record) update.mutate({ ...body, baseVersion: record.latestVersion }, { onSuccess: done });
    else create.mutate(body, { onSuccess: done });
  };
  return { save, mutation: record ? update : create, savedVersion, versions, useVersion };
}
