-- The audit trail is append-only: the database itself refuses to change or remove an event,
-- whoever sends the SQL. (TRUNCATE and DROP bypass row triggers; the application's database
-- account should not hold the DROP privilege in production.)
CREATE TRIGGER `audit_events_refuse_update` BEFORE UPDATE ON `audit_events` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_events is append-only: UPDATE refused';
--> statement-breakpoint
CREATE TRIGGER `audit_events_refuse_delete` BEFORE DELETE ON `audit_events` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_events is append-only: DELETE refused';
