-- Custom SQL migration file, put your code below! --
-- A run's status and progress live in its row; each change is announced on the channel loamwork_run
-- (LISTEN/NOTIFY, in PGlite and PostgreSQL alike), delivered when the change commits, so whoever watches
-- a run learns of it from the one place it is written, whichever process wrote it.
CREATE OR REPLACE FUNCTION loamwork_notify_run() RETURNS trigger AS $$
BEGIN
  IF NEW.status IS DISTINCT FROM OLD.status OR NEW.progress IS DISTINCT FROM OLD.progress THEN
    PERFORM pg_notify('loamwork_run', json_build_object(
      'runId', NEW.id, 'status', NEW.status, 'progress', NEW.progress, 'startedAt', NEW.started_at)::text);
  END IF;
  RETURN NULL;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER analysis_runs_notify AFTER UPDATE ON analysis_runs
  FOR EACH ROW EXECUTE FUNCTION loamwork_notify_run();
