import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatSelect, MatSelectModule } from '@angular/material/select';
import { type InviteResponse, type Person, type Role, roles } from '@loadwright/contracts';
import { filter, switchMap } from 'rxjs';
import { SessionStore } from '../core/auth/session-store';
import { problemMessage } from '../core/problems/api-problem';
import { confirmAction } from '../shared/confirm-dialog/confirm-dialog';
import { InviteDialog } from './invite-dialog';
import { PeopleClient } from './people-client';
import { personStatus } from './person-status';

/** The People page (admins): who can sign in, their roles and standing; invite, change role, deactivate, reactivate. */
@Component({
  selector: 'lw-people',
  imports: [DatePipe, MatButtonModule, MatIconModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './people.html',
  styleUrl: './people.scss',
})
export class People {
  private readonly client = inject(PeopleClient);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(SessionStore);

  /** Everyone, or null while loading. */
  protected readonly people = signal<Person[] | null>(null);
  /** Why the list could not be read or an action failed, or null. */
  protected readonly problem = signal<string | null>(null);
  /** What the last action did, announced politely. */
  protected readonly outcome = signal<string | null>(null);
  /** Roles to choose from. */
  protected readonly roles = roles;
  /** The admin looking at the page; they cannot demote or deactivate themselves here. */
  protected readonly myId = () => this.session.user()?.id;
  /** Standing of a person in words. */
  protected readonly statusOf = personStatus;

  constructor() {
    this.load();
  }

  /** Reads the list from the API. */
  protected load(): void {
    this.client
      .list()
      .subscribe({ next: (people) => this.people.set(people), error: (error: unknown) => this.problem.set(problemMessage(error)) });
  }

  /** Opens the invite dialog and adds the invited person to the list. */
  protected openInvite(): void {
    this.dialog
      .open<InviteDialog, void, InviteResponse>(InviteDialog, { width: '480px', autoFocus: 'first-tabbable' })
      .afterClosed()
      .pipe(filter((invited): invited is InviteResponse => !!invited))
      .subscribe(({ mailNotice, ...person }) => {
        this.replace(person);
        this.report(mailNotice);
      });
  }

  /** Asks, then changes a person's role; on cancel the picker goes back to the current role. */
  protected changeRole(person: Person, role: Role, picker: MatSelect): void {
    confirmAction(this.dialog, {
      title: `Make ${person.displayName} ${article(role)} ${role}?`,
      consequence: `${person.displayName} is signed out everywhere at once and signs in again with what the ${role} role allows.`,
      confirmLabel: 'Change role',
    }).subscribe((go) => {
      if (!go) {
        picker.value = person.role;
        return;
      }
      this.client.update(person.id, { role }).subscribe({
        next: (updated) => {
          this.replace(updated);
          this.report(`${updated.displayName} is now ${article(role)} ${role}.`);
        },
        error: (error: unknown) => {
          picker.value = person.role;
          this.fail(error);
        },
      });
    });
  }

  /** Asks, then deactivates (signs out at once, no more sign-ins) or reactivates a person. */
  protected setActive(person: Person, active: boolean): void {
    confirmAction(this.dialog, {
      title: `${active ? 'Reactivate' : 'Deactivate'} ${person.displayName}?`,
      consequence: active
        ? `${person.displayName} can sign in again with their role (${person.role}).`
        : `${person.displayName} is signed out everywhere at once and cannot sign in until reactivated. Their history stays in the audit log.`,
      confirmLabel: active ? 'Reactivate' : 'Deactivate',
      destructive: !active,
    })
      .pipe(
        filter(Boolean),
        switchMap(() => this.client.update(person.id, { active })),
      )
      .subscribe({
        next: (updated) => {
          this.replace(updated);
          this.report(`${updated.displayName} is ${active ? 'active again' : 'deactivated'}.`);
        },
        error: (error: unknown) => this.fail(error),
      });
  }

  /** Sends a fresh invite link to someone who has not set a password yet. */
  protected resendInvite(person: Person): void {
    this.client
      .resendInvite(person.id)
      .subscribe({ next: ({ message }) => this.report(message), error: (error: unknown) => this.fail(error) });
  }

  /** Puts a changed or new person into the list, keeping it ordered by name. */
  private replace(person: Person): void {
    this.people.update((people) =>
      [...(people ?? []).filter((other) => other.id !== person.id), person].sort((a, b) => a.displayName.localeCompare(b.displayName)),
    );
  }

  /** Shows what an action did. */
  private report(message: string): void {
    this.problem.set(null);
    this.outcome.set(message);
  }

  /** Shows why an action failed. */
  private fail(error: unknown): void {
    this.outcome.set(null);
    this.problem.set(problemMessage(error));
  }
}

/** "an" before a role that starts with a vowel sound. */
function article(role: Role): string {
  return role === 'admin' ? 'an' : 'a';
}
