import { HttpErrorResponse } from '@angular/common/http';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { MAT_DIALOG_DATA, MatDialogRef } from '@angular/material/dialog';
import { NameDialog, type NameDialogData } from './name-dialog';
import { until } from '../../testing/until';

interface Saved {
  name: string;
  version: number;
}

const failure = (status: number, code: string, message: string, details: unknown[] = []) =>
  new HttpErrorResponse({ status, error: { error: { code, message, details } }, url: '/api/v1/x' });

describe('NameDialog', () => {
  let dialogRef: jasmine.SpyObj<MatDialogRef<NameDialog<Saved, Saved>, Saved>>;

  async function render(data: Partial<NameDialogData<Saved, Saved>> & Pick<NameDialogData<Saved, Saved>, 'save'>) {
    dialogRef = jasmine.createSpyObj<MatDialogRef<NameDialog<Saved, Saved>, Saved>>('MatDialogRef', ['close']);
    TestBed.configureTestingModule({
      imports: [NameDialog],
      providers: [
        { provide: MatDialogRef, useValue: dialogRef },
        { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
        {
          provide: MAT_DIALOG_DATA,
          useValue: {
            title: 'Rename project',
            label: 'Project name',
            initial: 'Old name',
            submitLabel: 'Rename',
            maxLength: 20,
            ...data,
          },
        },
      ],
    });
    const fixture = TestBed.createComponent(NameDialog<Saved, Saved>);
    fixture.detectChanges();
    await fixture.whenStable();
    const el = fixture.nativeElement as HTMLElement;
    const input = el.querySelector<HTMLInputElement>('input')!;
    const type = async (value: string) => {
      input.value = value;
      input.dispatchEvent(new Event('input'));
      await fixture.whenStable();
    };
    const click = async (label: string) => {
      Array.from(el.querySelectorAll<HTMLButtonElement>('button'))
        .find((b) => b.textContent?.trim() === label)!
        .click();
      await until(() => !fixture.componentInstance['edit'].isPending(), 'the save or reload to finish');
      await fixture.whenStable();
    };
    const buttons = () => Array.from(el.querySelectorAll('button'), (b) => b.textContent?.trim());
    return { el, input, type, click, buttons };
  }

  it('saves the trimmed name and closes with what the save answered', async () => {
    const save = jasmine.createSpy('save').and.resolveTo({ name: 'New name', version: 2 });
    const { type, click, input } = await render({ save });
    expect(input.value).toBe('Old name');
    await type('  New name ');
    await click('Rename');
    // No choice is asked here, so the choice is empty.
    expect(save).toHaveBeenCalledOnceWith('New name', '', null);
    expect(dialogRef.close).toHaveBeenCalledOnceWith({ name: 'New name', version: 2 });
  });

  it('asks for a name when it is left empty or too long, and saves nothing', async () => {
    const save = jasmine.createSpy('save');
    const { type, click, el } = await render({ save, requiredMessage: 'Enter a project name' });
    await type('   ');
    await click('Rename');
    expect(el.querySelector('mat-error')?.textContent).toContain('Enter a project name');
    await type('x'.repeat(21));
    await click('Rename');
    expect(el.querySelector('mat-error')?.textContent).toContain('at most 20');
    expect(save).not.toHaveBeenCalled();
    expect(dialogRef.close).not.toHaveBeenCalled();
  });

  it('closes without saving an unchanged name when asked to', async () => {
    const save = jasmine.createSpy('save');
    const { click } = await render({ save, closeIfUnchanged: true });
    await click('Rename');
    expect(save).not.toHaveBeenCalled();
    expect(dialogRef.close).toHaveBeenCalledOnceWith();
  });

  it('offers Reload when someone saved first, then saves the typed name over the latest version', async () => {
    const save = jasmine
      .createSpy('save')
      .and.rejectWith(failure(409, 'stale_update', 'Ann saved this project after you opened it'));
    const load = jasmine.createSpy('load').and.callFake(() => {
      // After the reload, a save made from the latest version (5) goes through.
      save.and.callFake((name: string, _choice: string, current: Saved | null) =>
        Promise.resolve({ name, version: (current?.version ?? 0) + 1 }),
      );
      return Promise.resolve({ name: 'Ann’s name', version: 5 });
    });
    const { type, click, el, buttons, input } = await render({
      save,
      versioned: { record: { name: 'Old name', version: 1 }, load },
    });
    await type('Mine');
    await click('Rename');
    expect(el.querySelector('[role="alert"]')?.textContent).toContain('Ann saved this project after you opened it');
    expect(buttons()).toContain('Reload');
    expect(dialogRef.close).not.toHaveBeenCalled();

    await click('Reload');
    expect(load).toHaveBeenCalledOnceWith({ name: 'Old name', version: 1 });
    expect(input.value).toBe('Mine');
    expect(buttons()).not.toContain('Reload');
    await click('Rename');
    expect(dialogRef.close).toHaveBeenCalledOnceWith({ name: 'Mine', version: 6 });
  });

  it('shows a field error from the server on the field, without Reload when there is nothing to reload', async () => {
    const save = jasmine
      .createSpy('save')
      .and.rejectWith(
        failure(400, 'invalid_input', 'Check the name', [{ path: 'name', message: 'That name is taken here' }]),
      );
    const { type, click, el, buttons } = await render({ save });
    await type('Taken');
    await click('Rename');
    expect(el.querySelector('mat-error')?.textContent).toContain('That name is taken here');
    expect(buttons()).not.toContain('Reload');
    expect(dialogRef.close).not.toHaveBeenCalled();
  });
});
