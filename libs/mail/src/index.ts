/** @loadwright/mail: the public surface of the library. */
export * from './deliver-mail';
export * from './mail-catcher';
export * from './mail-log';
export * from './mail-queue';
export * from './mailer';
export * from './outbox-store';
export * from './templates';
