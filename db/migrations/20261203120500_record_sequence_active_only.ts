import type { Knex } from "knex";
import { up as createPreviousVersion } from "./20261203110100_record_sequence_flags";

/**
 * record_sequence, third version: accepts uploads only while the session is active (consented
 * or in progress; earlier versions also took them from completed sessions), and takes the
 * participant row lock with a locking read that also reads the status (earlier versions judged
 * by ROW_COUNT() of an UPDATE, which counts changed rows only, so two uploads in the same
 * millisecond could refuse the second). Everything else as the second version
 * (20261203110100_record_sequence_flags.ts, movement flags included), which `down` restores.
 */
const CREATE = `
CREATE PROCEDURE record_sequence(
  IN p_participant INT UNSIGNED, IN p_now DATETIME(3), IN p_key VARCHAR(100), IN p_condition VARCHAR(200),
  IN p_condition_index INT UNSIGNED, IN p_block INT UNSIGNED, IN p_sequence INT UNSIGNED, IN p_practice TINYINT(1),
  IN p_unit VARCHAR(12), IN p_amplitude DOUBLE, IN p_width DOUBLE, IN p_sample_count INT UNSIGNED,
  IN p_stream LONGBLOB, IN p_quality LONGTEXT, IN p_movements LONGTEXT)
MODIFIES SQL DATA
BEGIN
  DECLARE stored INT DEFAULT 0;
  DECLARE current_status VARCHAR(20) DEFAULT NULL;
  DECLARE EXIT HANDLER FOR 1062 BEGIN ROLLBACK; SELECT 'duplicate' AS outcome, 0 AS movements; END;
  DECLARE EXIT HANDLER FOR SQLEXCEPTION BEGIN ROLLBACK; RESIGNAL; END;
  START TRANSACTION;
  SELECT status INTO current_status FROM participants WHERE id = p_participant FOR UPDATE;
  IF current_status IS NULL OR current_status NOT IN ('consented', 'in_progress') THEN
    ROLLBACK;
    SELECT 'refused' AS outcome, 0 AS movements;
  ELSE
    UPDATE participants
       SET last_activity_at = p_now,
           started_at = IF(status = 'consented', p_now, started_at),
           status = IF(status = 'consented', 'in_progress', status)
     WHERE id = p_participant;
    INSERT INTO sequence_streams (participant_id, upload_key, \`condition\`, condition_index, block, sequence, practice, sample_count, movement_count, stream_gz, quality)
    VALUES (p_participant, p_key, p_condition, p_condition_index, p_block, p_sequence, p_practice, p_sample_count, JSON_LENGTH(p_movements), p_stream, p_quality);
    INSERT INTO trials (participant_id, \`condition\`, condition_index, block, sequence, trial, practice, unit, amplitude, width,
                        from_x, from_y, to_x, to_y, start_x, start_y, end_x, end_y, time_ms, hit, timed_out, recentered, clutched, upload_key)
    SELECT p_participant, p_condition, p_condition_index, p_block, p_sequence, m.trial, p_practice, p_unit, p_amplitude, p_width,
           m.from_x, m.from_y, m.to_x, m.to_y, m.start_x, m.start_y, m.end_x, m.end_y, m.time_ms, m.hit,
           m.timed_out, m.recentered, m.clutched, p_key
      FROM JSON_TABLE(p_movements, '$[*]' COLUMNS (
             trial INT UNSIGNED PATH '$.trial' ERROR ON EMPTY ERROR ON ERROR,
             from_x DOUBLE PATH '$.from_x' ERROR ON EMPTY ERROR ON ERROR, from_y DOUBLE PATH '$.from_y' ERROR ON EMPTY ERROR ON ERROR,
             to_x DOUBLE PATH '$.to_x' ERROR ON EMPTY ERROR ON ERROR, to_y DOUBLE PATH '$.to_y' ERROR ON EMPTY ERROR ON ERROR,
             start_x DOUBLE PATH '$.start_x' ERROR ON EMPTY ERROR ON ERROR, start_y DOUBLE PATH '$.start_y' ERROR ON EMPTY ERROR ON ERROR,
             end_x DOUBLE PATH '$.end_x' ERROR ON EMPTY ERROR ON ERROR, end_y DOUBLE PATH '$.end_y' ERROR ON EMPTY ERROR ON ERROR,
             time_ms DOUBLE PATH '$.time_ms' ERROR ON EMPTY ERROR ON ERROR,
             hit TINYINT PATH '$.hit' ERROR ON EMPTY ERROR ON ERROR,
             timed_out TINYINT PATH '$.timed_out' DEFAULT '0' ON EMPTY ERROR ON ERROR,
             recentered TINYINT PATH '$.recentered' DEFAULT '0' ON EMPTY ERROR ON ERROR,
             clutched TINYINT PATH '$.clutched' DEFAULT '0' ON EMPTY ERROR ON ERROR)) AS m;
    SET stored = ROW_COUNT();
    COMMIT;
    SELECT 'stored' AS outcome, stored AS movements;
  END IF;
END`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw("DROP PROCEDURE IF EXISTS record_sequence");
  await knex.raw(CREATE);
}

export async function down(knex: Knex): Promise<void> {
  await createPreviousVersion(knex);
}
