import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { SiteSettings, UpdateSiteSettingsRequest } from '@crankjournal/shared-types';
import { api } from '../../../api/http';

export const siteKeys = {
  all: ['site'] as const,
  settings: () => [...siteKeys.all, 'settings'] as const,
};

export const siteSettingsQuery = () => queryOptions({ queryKey: siteKeys.settings(), queryFn: () => api<SiteSettings>('/site/settings') });

export const updateSiteSettings = (req: UpdateSiteSettingsRequest) => api<SiteSettings>('/site/settings', { method: 'PUT', body: req });

export function useUpdateSiteSettings() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: updateSiteSettings,
    onSuccess: (saved) => qc.setQueryData(siteKeys.settings(), saved),
  });
}
