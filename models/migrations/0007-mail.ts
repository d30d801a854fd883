import { DataTypes } from 'sequelize';
import { id, reference, timestamps } from './column-helpers';
import type { SchemaMigration } from './types';

/**
 * Mail: the outgoing queue (every mail is stored before it is sent, so a mail server that is down never fails the
 * action that wanted it; the mailer retries with back-off), the messages the local stand-in mail server received,
 * study invitations and password resets (only the SHA-256 of a link's secret is kept), and each person's mail
 * choices (kinds turned off, daily digest).
 */
export const mail: SchemaMigration = {
  name: '0007-mail',
  async up(queryInterface, transaction) {
    await queryInterface.createTable(
      'outgoing_mails',
      {
        id,
        user_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        to_address: { type: DataTypes.STRING, allowNull: false },
        purpose: { type: DataTypes.STRING, allowNull: false },
        subject: { type: DataTypes.STRING, allowNull: false },
        text_body: { type: DataTypes.TEXT, allowNull: false },
        html_body: { type: DataTypes.TEXT, allowNull: false },
        state: { type: DataTypes.STRING, allowNull: false },
        attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        next_attempt_at: { type: DataTypes.DATE, allowNull: true },
        last_error: { type: DataTypes.TEXT, allowNull: true },
        sent_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('outgoing_mails', ['state', 'next_attempt_at'], { transaction });
    await queryInterface.createTable(
      'received_mails',
      {
        id,
        message_id: { type: DataTypes.STRING, allowNull: true },
        sender: { type: DataTypes.STRING, allowNull: false },
        recipients: { type: DataTypes.JSON, allowNull: false },
        subject: { type: DataTypes.STRING, allowNull: false },
        text_body: { type: DataTypes.TEXT, allowNull: false },
        html_body: { type: DataTypes.TEXT, allowNull: true },
        size: { type: DataTypes.INTEGER, allowNull: false },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.createTable(
      'invitations',
      {
        id,
        study_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('studies', 'CASCADE') },
        email: { type: DataTypes.STRING, allowNull: false },
        role: { type: DataTypes.STRING, allowNull: false },
        invited_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        secret_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        accepted_at: { type: DataTypes.DATE, allowNull: true },
        accepted_by_id: { type: DataTypes.INTEGER, allowNull: true, ...reference('users', 'SET NULL') },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('invitations', ['study_id', 'email'], { transaction });
    await queryInterface.createTable(
      'password_resets',
      {
        id,
        user_id: { type: DataTypes.INTEGER, allowNull: false, ...reference('users', 'CASCADE') },
        secret_hash: { type: DataTypes.STRING, allowNull: false, unique: true },
        expires_at: { type: DataTypes.DATE, allowNull: false },
        used_at: { type: DataTypes.DATE, allowNull: true },
        ...timestamps,
      },
      { transaction },
    );
    await queryInterface.addIndex('password_resets', ['user_id'], { transaction });
    await queryInterface.addColumn('users', 'mail_kinds_off', { type: DataTypes.JSON, allowNull: false, defaultValue: '[]' }, { transaction });
    await queryInterface.addColumn('users', 'mail_digest', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false }, { transaction });
    await queryInterface.addColumn('users', 'digest_sent_at', { type: DataTypes.DATE, allowNull: true }, { transaction });
  },
  async down(queryInterface, transaction) {
    await queryInterface.removeColumn('users', 'digest_sent_at', { transaction });
    await queryInterface.removeColumn('users', 'mail_digest', { transaction });
    await queryInterface.removeColumn('users', 'mail_kinds_off', { transaction });
    await queryInterface.dropTable('password_resets', { transaction });
    await queryInterface.dropTable('invitations', { transaction });
    await queryInterface.dropTable('received_mails', { transaction });
    await queryInterface.dropTable('outgoing_mails', { transaction });
  },
};
