-- Custom SQL migration file, put your code below! ---- The audit trail is append-only (product.md "Audit entry"): refuse any change or removal in the database itself.
CREATE OR REPLACE FUNCTION loamwork_audit_append_only() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'audit entries are append-only' USING ERRCODE = 'P0001';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER audit_entries_append_only BEFORE UPDATE OR DELETE ON audit_entries
  FOR EACH ROW EXECUTE FUNCTION loamwork_audit_append_only();
--> statement-breakpoint
CREATE TRIGGER audit_entries_no_truncate BEFORE TRUNCATE ON audit_entries
  FOR EACH STATEMENT EXECUTE FUNCTION loamwork_audit_append_only();
