-- Bench records are kept: the database refuses to delete a record or its bytes, and to change a
-- record's file or settings, whoever sends the SQL. The only change allowed is withdrawing it once
-- (withdrawn_at, withdrawn_by_user_id, withdrawn_reason set from null). (TRUNCATE and DROP bypass
-- row triggers; the application's database account should not hold the DROP privilege in production.)
CREATE TRIGGER `bench_records_refuse_delete` BEFORE DELETE ON `bench_records` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'bench_records are kept: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `bench_records_refuse_update` BEFORE UPDATE ON `bench_records` FOR EACH ROW
BEGIN
  IF NOT (NEW.id <=> OLD.id
      AND NEW.workspace_id <=> OLD.workspace_id
      AND NEW.plan_id <=> OLD.plan_id
      AND NEW.revision_id <=> OLD.revision_id
      AND BINARY NEW.file_name <=> BINARY OLD.file_name
      AND NEW.format <=> OLD.format
      AND NEW.byte_length <=> OLD.byte_length
      AND BINARY NEW.sha256 <=> BINARY OLD.sha256
      AND NEW.chunk_count <=> OLD.chunk_count
      AND BINARY NEW.channel <=> BINARY OLD.channel
      AND NEW.unit <=> OLD.unit
      AND NEW.sample_rate_given_hz <=> OLD.sample_rate_given_hz
      AND NEW.gain_mode <=> OLD.gain_mode
      AND NEW.gain_v_per_v <=> OLD.gain_v_per_v
      AND BINARY NEW.note <=> BINARY OLD.note
      AND BINARY NEW.analysis <=> BINARY OLD.analysis
      AND BINARY NEW.comparison <=> BINARY OLD.comparison
      AND NEW.created_by_user_id <=> OLD.created_by_user_id
      AND NEW.created_at <=> OLD.created_at) THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'bench_records content is kept as uploaded: UPDATE refused';
  END IF;
  IF OLD.withdrawn_at IS NOT NULL THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'bench record already withdrawn: UPDATE refused';
  END IF;
END;
--> statement-breakpoint
CREATE TRIGGER `bench_record_chunks_refuse_update` BEFORE UPDATE ON `bench_record_chunks` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'bench_record_chunks are kept as uploaded: UPDATE refused';
--> statement-breakpoint
CREATE TRIGGER `bench_record_chunks_refuse_delete` BEFORE DELETE ON `bench_record_chunks` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'bench_record_chunks are kept: DELETE refused';
