-- The change log is evidence: once written, a row is never changed or removed.
CREATE FUNCTION change_log_refuse_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'change_log is append-only (% refused)', TG_OP
    USING ERRCODE = 'insufficient_privilege';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER change_log_append_only
  BEFORE UPDATE OR DELETE ON change_log
  FOR EACH ROW EXECUTE FUNCTION change_log_refuse_change();
--> statement-breakpoint
CREATE TRIGGER change_log_no_truncate
  BEFORE TRUNCATE ON change_log
  FOR EACH STATEMENT EXECUTE FUNCTION change_log_refuse_change();
