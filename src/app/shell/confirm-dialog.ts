import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialog, MatDialogModule } from '@angular/material/dialog';
import { firstValueFrom } from 'rxjs';

export interface ConfirmData {
  title: string;
  message: string;
  /** The button that goes ahead, named for what it does ("Revoke token"). */
  confirm: string;
  /** The button that does nothing; "Keep it" unless given. */
  cancel?: string;
  /** Go-ahead button in the error colour (default), or plain for a change that can be undone. */
  tone?: 'danger' | 'plain';
}

/** Asks before something that cannot be undone, or that changes who can do what. */
@Component({
  selector: 'erg-confirm-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content><p>{{ data.message }}</p></mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button type="button" [mat-dialog-close]="false">{{ data.cancel ?? 'Keep it' }}</button>
      <button mat-flat-button type="button" [class.danger]="(data.tone ?? 'danger') === 'danger'" [mat-dialog-close]="true">{{ data.confirm }}</button>
    </mat-dialog-actions>
  `,
  styles: `.danger { background: var(--mat-sys-error); color: var(--mat-sys-on-error); }`,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmData>(MAT_DIALOG_DATA);
}

/** Opens the confirmation and resolves true only when the user chose to go ahead. */
export async function confirmed(dialog: MatDialog, data: ConfirmData): Promise<boolean> {
  return (await firstValueFrom(dialog.open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, { data, maxWidth: '480px' }).afterClosed())) === true;
}
