import type { Sequelize } from 'sequelize';
import type { Config } from './config';
import type { Mailer } from './services/mail/mailer';

/** What the feature routers are built with (see features.ts). */
export interface FeatureContext {
  config: Config;
  sequelize: Sequelize;
  /** Outgoing mail (review, release, invitations); without it those mails are recorded as failed. */
  mailer?: Mailer;
  /** The clock of time-limited things (invitation expiry); tests move it. */
  now?: () => Date;
}
