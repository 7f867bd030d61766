-- A password, role or membership change ends every open session of that user, whichever
-- process or script made the change (src/db/schema/auth.ts, DEVELOPERS.md "Sign-in").
CREATE OR REPLACE FUNCTION end_sessions_on_access_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_TABLE_NAME = 'users' THEN
    UPDATE sessions SET ended_at = now(), ended_reason = 'password-changed'
      WHERE user_id = NEW.id AND ended_at IS NULL;
    RETURN NULL;
  END IF;
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    UPDATE sessions SET ended_at = now(), ended_reason = 'access-changed'
      WHERE user_id = OLD.user_id AND ended_at IS NULL;
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    UPDATE sessions SET ended_at = now(), ended_reason = 'access-changed'
      WHERE user_id = NEW.user_id AND ended_at IS NULL;
  END IF;
  RETURN NULL;
END
$$;
--> statement-breakpoint
CREATE TRIGGER users_password_ends_sessions AFTER UPDATE OF password_hash ON users
  FOR EACH ROW WHEN (OLD.password_hash IS DISTINCT FROM NEW.password_hash)
  EXECUTE FUNCTION end_sessions_on_access_change();
--> statement-breakpoint
CREATE TRIGGER memberships_change_ends_sessions AFTER INSERT OR DELETE ON memberships
  FOR EACH ROW EXECUTE FUNCTION end_sessions_on_access_change();
--> statement-breakpoint
CREATE TRIGGER memberships_update_ends_sessions AFTER UPDATE ON memberships
  FOR EACH ROW WHEN (OLD IS DISTINCT FROM NEW)
  EXECUTE FUNCTION end_sessions_on_access_change();
