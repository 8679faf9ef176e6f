-- Revisions are immutable: a saved revision is a record of what was built from.
CREATE FUNCTION revisions_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'revisions are immutable; save a new revision instead';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER revisions_no_update BEFORE UPDATE ON revisions
  FOR EACH ROW EXECUTE FUNCTION revisions_refuse_update();
