import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatDialog, MatDialogRef } from '@angular/material/dialog';
import { MatDialogHarness } from '@angular/material/dialog/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatSelectHarness } from '@angular/material/select/testing';

import { UserAddDialog } from './user-add-dialog';
import type { UserRow } from './users-api';

@Component({ template: '' })
class Host {}

describe('UserAddDialog', () => {
  let http: HttpTestingController;
  let loader: HarnessLoader;
  let dialogRef: MatDialogRef<UserAddDialog, UserRow>;
  let closedWith: UserRow | undefined | 'open';

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [provideHttpClient(), provideHttpClientTesting()],
    });
    http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(Host);
    loader = TestbedHarnessEnvironment.documentRootLoader(fixture);
    dialogRef = TestBed.inject(MatDialog).open<UserAddDialog, void, UserRow>(UserAddDialog);
    closedWith = 'open';
    // beforeClosed fires at once; afterClosed waits for the closing animation.
    dialogRef.beforeClosed().subscribe((value) => (closedWith = value));
    await fixture.whenStable();
  });

  afterEach(() => {
    http.verify();
    TestBed.inject(MatDialog).closeAll();
  });

  async function field(label: string): Promise<MatFormFieldHarness> {
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  async function type(label: string, value: string): Promise<void> {
    const control = (await (await field(label)).getControl(MatInputHarness)) as MatInputHarness;
    await control.setValue(value);
    await control.blur();
  }

  async function chooseRole(role: string): Promise<void> {
    const select = await loader.getHarness(MatSelectHarness);
    await select.open();
    await select.clickOptions({ text: role });
  }

  async function submit(): Promise<void> {
    await (await loader.getHarness(MatButtonHarness.with({ text: 'Add user' }))).click();
  }

  async function errorsOf(label: string): Promise<string[]> {
    return (await field(label)).getTextErrors();
  }

  async function fillValid(): Promise<void> {
    await type('Name', 'Oren Blackwood');
    await type('E-mail', 'oren@example.test');
    await chooseRole('Machinist');
    await type('First password', 'twelve-chars');
  }

  it('when submitted empty, then nothing is sent and every field says what it needs', async () => {
    await submit();
    http.expectNone('/api/users');
    expect(await errorsOf('Name')).toEqual(["Enter the person's name."]);
    expect(await errorsOf('E-mail')).toEqual(['Enter an e-mail address.']);
    expect(await errorsOf('Role')).toEqual(['Choose what this person may do.']);
    expect(await errorsOf('First password')).toEqual(['Set a first password.']);
    expect(closedWith).toBe('open');
  });

  it('when the password has 11 characters, then it is refused before sending', async () => {
    await fillValid();
    await type('First password', 'eleven-char');
    await submit();
    http.expectNone('/api/users');
    expect(await errorsOf('First password')).toEqual(['Use at least 12 characters.']);
  });

  it('when the e-mail has no domain, then it is refused before sending', async () => {
    await fillValid();
    await type('E-mail', 'oren@');
    await submit();
    http.expectNone('/api/users');
    expect(await errorsOf('E-mail')).toEqual(['That is not an e-mail address.']);
  });

  it('when everything is valid (password exactly 12 characters), then it posts and closes with the new user', async () => {
    await fillValid();
    await submit();
    const request = http.expectOne('/api/users');
    expect(request.request.method).toBe('POST');
    expect(request.request.body).toEqual({
      name: 'Oren Blackwood',
      email: 'oren@example.test',
      role: 'machinist',
      password: 'twelve-chars',
    });
    const user: UserRow = {
      id: 'u9',
      name: 'Oren Blackwood',
      email: 'oren@example.test',
      role: 'machinist',
      active: true,
      createdAt: '2026-03-02T08:00:00.000Z',
    };
    request.flush({ user }, { status: 201, statusText: 'Created' });
    expect(closedWith).toEqual(user);
  });

  it('when the server refuses the e-mail, then its messages show and the dialog stays open', async () => {
    await fillValid();
    await submit();
    http.expectOne('/api/users').flush(
      {
        error: {
          code: 'conflict',
          message: 'Someone already signs in with that e-mail.',
          details: [{ field: 'email', message: 'Already in use' }],
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    const dialog = await loader.getHarness(MatDialogHarness);
    const host = await dialog.host();
    expect(await host.text()).toContain('Someone already signs in with that e-mail.');
    expect(await errorsOf('E-mail')).toEqual(['Already in use.']);
    expect(closedWith).toBe('open');
  });
});
