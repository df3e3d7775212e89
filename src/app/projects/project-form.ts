import { type NonNullableFormBuilder, Validators } from '@angular/forms';
import { PROJECT_NAME_MAX_LENGTH, type Project, type ProjectInput } from '@shared/projects/project-schemas';

/** Longest texts the API accepts (same limits as the project schemas). */
export const PROJECT_TEXT_LIMITS = {
  clientName: 160,
  siteAddress: 500,
  notes: 4000,
} as const;

/** The form for a project's details: name, client, site address, climate site and notes. */
export function projectDetailsForm(fb: NonNullableFormBuilder) {
  return fb.group({
    name: ['', [Validators.required, Validators.maxLength(PROJECT_NAME_MAX_LENGTH)]],
    clientName: ['', [Validators.maxLength(PROJECT_TEXT_LIMITS.clientName)]],
    siteAddress: ['', [Validators.maxLength(PROJECT_TEXT_LIMITS.siteAddress)]],
    climateSiteId: fb.control<string | null>(null),
    notes: ['', [Validators.maxLength(PROJECT_TEXT_LIMITS.notes)]],
  });
}

export type ProjectDetailsForm = ReturnType<typeof projectDetailsForm>;

/** The details the form edits (the equipment list is chosen on its own). */
export type ProjectDetails = Required<Omit<ProjectInput, 'equipmentListId'>>;

/** The form's values as the API takes them (texts trimmed). */
export function projectDetailsValue(form: ProjectDetailsForm): ProjectDetails {
  const v = form.getRawValue();
  return {
    name: v.name.trim(),
    clientName: v.clientName.trim(),
    siteAddress: v.siteAddress.trim(),
    climateSiteId: v.climateSiteId,
    notes: v.notes.trim(),
  };
}

/** Puts a project's stored details into the form. */
export function fillProjectDetails(form: ProjectDetailsForm, project: Project): void {
  form.reset({
    name: project.name,
    clientName: project.clientName,
    siteAddress: project.siteAddress,
    climateSiteId: project.climateSiteId,
    notes: project.notes,
  });
}

/**
 * Checks the form before sending: a name of only spaces counts as empty.
 * Returns false (with every error shown) when the form cannot be sent.
 */
export function checkProjectDetails(form: ProjectDetailsForm): boolean {
  const name = form.controls.name;
  if (!name.value.trim()) name.setValue('');
  if (form.invalid) {
    form.markAllAsTouched();
    return false;
  }
  return true;
}
