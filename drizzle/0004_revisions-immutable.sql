-- A revision is frozen when it is created. The database itself refuses any change of its content
-- (plan, report, content hash, label, change summary, author, ...) and any deletion, whoever sends
-- the SQL; only its state may move, and only along draft → in-review → released | changes-requested,
-- released → superseded. Text columns are compared as binary so that a change of letter case or of
-- trailing spaces is refused too. (TRUNCATE and DROP bypass row triggers; the application's
-- database account should not hold the DROP privilege in production.)
CREATE TRIGGER `plan_revisions_refuse_update` BEFORE UPDATE ON `plan_revisions` FOR EACH ROW
BEGIN
  IF NOT (NEW.id <=> OLD.id
      AND NEW.workspace_id <=> OLD.workspace_id
      AND NEW.plan_id <=> OLD.plan_id
      AND NEW.sequence <=> OLD.sequence
      AND BINARY NEW.label <=> BINARY OLD.label
      AND BINARY NEW.change_summary <=> BINARY OLD.change_summary
      AND NEW.plan_version <=> OLD.plan_version
      AND BINARY NEW.plan <=> BINARY OLD.plan
      AND BINARY NEW.report <=> BINARY OLD.report
      AND BINARY NEW.content_hash <=> BINARY OLD.content_hash
      AND NEW.worst_verdict <=> OLD.worst_verdict
      AND NEW.created_by_user_id <=> OLD.created_by_user_id
      AND NEW.created_at <=> OLD.created_at) THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'plan_revisions content is immutable: UPDATE refused';
  END IF;
  IF NOT (NEW.state <=> OLD.state
      OR (OLD.state = 'draft' AND NEW.state = 'in-review')
      OR (OLD.state = 'in-review' AND NEW.state IN ('released', 'changes-requested'))
      OR (OLD.state = 'released' AND NEW.state = 'superseded')) THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'plan_revisions state transition refused';
  END IF;
END;
--> statement-breakpoint
CREATE TRIGGER `plan_revisions_refuse_delete` BEFORE DELETE ON `plan_revisions` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'plan_revisions is append-only: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `revision_state_events_refuse_update` BEFORE UPDATE ON `revision_state_events` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'revision_state_events is append-only: UPDATE refused';
--> statement-breakpoint
CREATE TRIGGER `revision_state_events_refuse_delete` BEFORE DELETE ON `revision_state_events` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'revision_state_events is append-only: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `review_signatures_refuse_update` BEFORE UPDATE ON `review_signatures` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_signatures is append-only: UPDATE refused';
--> statement-breakpoint
CREATE TRIGGER `review_signatures_refuse_delete` BEFORE DELETE ON `review_signatures` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_signatures is append-only: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `review_request_reviewers_refuse_update` BEFORE UPDATE ON `review_request_reviewers` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_request_reviewers is append-only: UPDATE refused';
--> statement-breakpoint
CREATE TRIGGER `review_request_reviewers_refuse_delete` BEFORE DELETE ON `review_request_reviewers` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_request_reviewers is append-only: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `review_requests_refuse_update` BEFORE UPDATE ON `review_requests` FOR EACH ROW
BEGIN
  IF NOT (NEW.id <=> OLD.id
      AND NEW.workspace_id <=> OLD.workspace_id
      AND NEW.revision_id <=> OLD.revision_id
      AND NEW.requested_by_user_id <=> OLD.requested_by_user_id
      AND BINARY NEW.message <=> BINARY OLD.message
      AND NEW.requested_at <=> OLD.requested_at) THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_requests: only the status may change';
  END IF;
  IF NOT (NEW.status <=> OLD.status OR OLD.status = 'open') THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_requests: a decided review cannot change';
  END IF;
END;
--> statement-breakpoint
CREATE TRIGGER `review_requests_refuse_delete` BEFORE DELETE ON `review_requests` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_requests is append-only: DELETE refused';
--> statement-breakpoint
CREATE TRIGGER `review_comments_refuse_update` BEFORE UPDATE ON `review_comments` FOR EACH ROW
BEGIN
  IF NOT (NEW.id <=> OLD.id
      AND NEW.workspace_id <=> OLD.workspace_id
      AND NEW.revision_id <=> OLD.revision_id
      AND NEW.parent_comment_id <=> OLD.parent_comment_id
      AND NEW.author_user_id <=> OLD.author_user_id
      AND NEW.anchor_kind <=> OLD.anchor_kind
      AND BINARY NEW.anchor_id <=> BINARY OLD.anchor_id
      AND BINARY NEW.body <=> BINARY OLD.body
      AND NEW.created_at <=> OLD.created_at) THEN
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_comments: only the resolution may change';
  END IF;
END;
--> statement-breakpoint
CREATE TRIGGER `review_comments_refuse_delete` BEFORE DELETE ON `review_comments` FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'review_comments is append-only: DELETE refused';
