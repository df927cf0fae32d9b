/** @loadwright/mail: the public surface of the library. */
export * from './mail-catcher';
export * from './mailer';
export * from './outbox-store';
export * from './templates';
