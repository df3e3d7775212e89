import type { Project } from '@shared/projects/project-schemas';
import type { ClimateSiteChoice } from '../projects-api';

export const PROJECT_ID = '0b6f1c3e-9d2a-4e5b-8c7d-6e5f4a3b2c00';
export const SITE_ID = '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c41';
export const OTHER_SITE_ID = '5a1b2c3d-4e5f-4a6b-8c7d-9e0f1a2b3c42';

/** The id of the n-th test project (n below 256). */
export function projectId(n: number): string {
  return `0b6f1c3e-9d2a-4e5b-8c7d-6e5f4a3b2c${n.toString(16).padStart(2, '0')}`;
}

export function aProject(name: string, fields: Partial<Project> = {}): Project {
  return {
    id: PROJECT_ID,
    name,
    clientName: '',
    siteAddress: '',
    climateSiteId: null,
    climateSiteName: null,
    equipmentListId: null,
    equipmentListName: null,
    notes: '',
    archived: false,
    version: 1,
    createdByName: 'Dana Frost',
    updatedByName: 'Dana Frost',
    createdAt: '2026-01-12T09:30:15.000Z',
    updatedAt: '2026-01-12T09:30:15.000Z',
    ...fields,
  };
}

/** Rows of GET /api/v1/climate-sites (the fields a project's select reads, plus the rest of a summary). */
export function someClimateSites(): (ClimateSiteChoice & Record<string, unknown>)[] {
  const rest = {
    latitude: null,
    longitude: null,
    elevationM: null,
    utcOffsetHours: null,
    sourceKind: 'published',
    heatingDb99: null,
    firstYear: null,
    lastYear: null,
    qualifyingYearCount: null,
    updatedAt: '2026-01-10T08:00:00.000Z',
  };
  return [
    { id: SITE_ID, name: 'Lakeview station', isDemo: false, heatingDb99_6: -20, ...rest },
    { id: OTHER_SITE_ID, name: 'Cold Hollow', isDemo: true, heatingDb99_6: -27.5, ...rest },
  ];
}
