// Reorder alerts. A part is watched against its reorder point: its own, or else the default the
// buyer keeps for its family and step (or for the whole family). When the free quantity (on hand
// minus held) falls to the point or below, one alert is raised and the buyers who want instant
// mail get an outbox row, in the same transaction as the movement. No second alert is raised until
// the part has recovered above the point; then the next fall is a new crossing.
//
// The check lives in the database (reorder_check, called by triggers on part_levels and parts) so
// every movement is seen, whichever feature wrote it. Services may also call it directly.
import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE reorder_defaults (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      family_id uuid NOT NULL REFERENCES engine_families (id) ON DELETE CASCADE,
      -- Null: every step of the family that has no default of its own.
      step_id uuid REFERENCES series_steps (id) ON DELETE CASCADE,
      kind text NOT NULL,
      reorder_point integer NOT NULL,
      order_up_to integer NOT NULL,
      updated_by uuid REFERENCES users (id),
      updated_at timestamptz NOT NULL DEFAULT now(),
      CONSTRAINT reorder_defaults_kind_check CHECK (kind IN ('piston', 'rings')),
      CONSTRAINT reorder_defaults_levels_check
        CHECK (reorder_point >= 0 AND order_up_to >= reorder_point AND order_up_to <= 1000000)
    );
    CREATE UNIQUE INDEX reorder_defaults_unique ON reorder_defaults
      (family_id, kind, coalesce(step_id, '00000000-0000-0000-0000-000000000000'::uuid));

    -- The rule a part is watched by: its own reorder point first, then its step's default, then
    -- its family's. source says which.
    CREATE FUNCTION part_reorder_rule(p_part uuid)
      RETURNS TABLE (reorder_point integer, order_up_to integer, source text)
      LANGUAGE sql STABLE AS $$
        SELECT r.reorder_point, r.order_up_to, r.source FROM (
          SELECT pa.reorder_point, pa.order_up_to, 'part'::text AS source, 0 AS rank
            FROM parts pa WHERE pa.id = p_part AND pa.reorder_point IS NOT NULL
          UNION ALL
          SELECT d.reorder_point, d.order_up_to,
                 CASE WHEN d.step_id IS NULL THEN 'family' ELSE 'step' END,
                 CASE WHEN d.step_id IS NULL THEN 2 ELSE 1 END
            FROM parts pa
            JOIN reorder_defaults d ON d.family_id = pa.family_id AND d.kind = pa.kind
                                   AND (d.step_id = pa.step_id OR d.step_id IS NULL)
           WHERE pa.id = p_part
        ) r ORDER BY r.rank LIMIT 1
      $$;

    CREATE TABLE alerts (
      id uuid PRIMARY KEY DEFAULT gen_random_uuid(),
      part_id uuid NOT NULL REFERENCES parts (id) ON DELETE CASCADE,
      kind text NOT NULL DEFAULT 'reorder_point',
      raised_at timestamptz NOT NULL DEFAULT now(),
      free_at_raise integer NOT NULL,
      reorder_point integer NOT NULL,
      -- Set when the part is back above its point: the crossing is over, the watch re-armed.
      recovered_at timestamptz,
      acknowledged_at timestamptz,
      acknowledged_by uuid REFERENCES users (id),
      CONSTRAINT alerts_kind_check CHECK (kind IN ('reorder_point')),
      CONSTRAINT alerts_ack_check CHECK (acknowledged_by IS NULL OR acknowledged_at IS NOT NULL),
      CONSTRAINT alerts_recovered_check CHECK (recovered_at IS NULL OR recovered_at >= raised_at)
    );
    -- One alert per crossing: while a crossing lasts, a second alert for the part cannot exist.
    CREATE UNIQUE INDEX alerts_one_per_crossing ON alerts (part_id, kind) WHERE recovered_at IS NULL;
    CREATE INDEX alerts_raised_idx ON alerts (raised_at DESC);
    CREATE INDEX alerts_open_idx ON alerts (raised_at DESC) WHERE acknowledged_at IS NULL;

    -- One daily digest per buyer and day, whether or not it had anything to say; covered_until is
    -- where the next day's digest starts.
    CREATE TABLE alert_digest_runs (
      user_id uuid NOT NULL REFERENCES users (id) ON DELETE CASCADE,
      day date NOT NULL,
      covered_until timestamptz NOT NULL,
      alerts integer NOT NULL,
      created_at timestamptz NOT NULL DEFAULT now(),
      PRIMARY KEY (user_id, day),
      CONSTRAINT alert_digest_runs_alerts_check CHECK (alerts >= 0)
    );

    -- p_fell: the free quantity (or the point) moved so that stock is now lower relative to the
    -- point than before; only such a change raises an alert, any change may re-arm the watch.
    CREATE FUNCTION reorder_check(p_part uuid, p_fell boolean) RETURNS uuid
      LANGUAGE plpgsql AS $$
      DECLARE
        v_kind text;
        v_active boolean;
        v_free integer;
        v_point integer;
        v_alert uuid;
      BEGIN
        SELECT pa.kind, pa.active, pl.on_hand - pl.held INTO v_kind, v_active, v_free
          FROM parts pa JOIN part_levels pl ON pl.part_id = pa.id
         WHERE pa.id = p_part;
        -- A kit is never counted itself; its components are watched.
        IF NOT FOUND OR v_kind = 'kit' THEN RETURN NULL; END IF;
        SELECT r.reorder_point INTO v_point FROM part_reorder_rule(p_part) r;
        IF v_point IS NULL OR NOT v_active OR v_free > v_point THEN
          UPDATE alerts SET recovered_at = now()
           WHERE part_id = p_part AND kind = 'reorder_point' AND recovered_at IS NULL;
          RETURN NULL;
        END IF;
        IF NOT p_fell THEN RETURN NULL; END IF;
        INSERT INTO alerts (part_id, kind, free_at_raise, reorder_point)
        VALUES (p_part, 'reorder_point', v_free, v_point)
        ON CONFLICT (part_id, kind) WHERE recovered_at IS NULL DO NOTHING
        RETURNING id INTO v_alert;
        IF v_alert IS NULL THEN RETURN NULL; END IF;
        -- The worker writes the message from the alert when it sends it (mail template).
        INSERT INTO outbox (to_address, template, data)
        SELECT u.email, 'reorder-alert', jsonb_build_object('alertId', v_alert)
          FROM users u
         WHERE u.role = 'buyer' AND u.active AND u.mail_mode = 'instant';
        RETURN v_alert;
      END $$;

    CREATE FUNCTION part_levels_reorder_watch() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF (NEW.on_hand - NEW.held) <> (OLD.on_hand - OLD.held) THEN
          PERFORM reorder_check(NEW.part_id, (NEW.on_hand - NEW.held) < (OLD.on_hand - OLD.held));
        END IF;
        RETURN NULL;
      END $$;
    CREATE TRIGGER part_levels_reorder_watch AFTER UPDATE OF on_hand, held ON part_levels
      FOR EACH ROW EXECUTE FUNCTION part_levels_reorder_watch();

    CREATE FUNCTION parts_reorder_watch() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        IF NEW.reorder_point IS DISTINCT FROM OLD.reorder_point OR NEW.active <> OLD.active THEN
          -- A raised point that now reaches the free quantity is a crossing too.
          PERFORM reorder_check(NEW.id,
            coalesce(NEW.reorder_point, -1) > coalesce(OLD.reorder_point, -1)
            OR (NEW.active AND NOT OLD.active));
        END IF;
        RETURN NULL;
      END $$;
    CREATE TRIGGER parts_reorder_watch AFTER UPDATE OF reorder_point, active ON parts
      FOR EACH ROW EXECUTE FUNCTION parts_reorder_watch();

    CREATE FUNCTION reorder_defaults_watch() RETURNS trigger LANGUAGE plpgsql AS $$
      DECLARE r record;
      BEGIN
        FOR r IN
          SELECT pa.id FROM parts pa
           WHERE pa.reorder_point IS NULL
             AND ((TG_OP <> 'DELETE' AND pa.family_id = NEW.family_id AND pa.kind = NEW.kind)
               OR (TG_OP <> 'INSERT' AND pa.family_id = OLD.family_id AND pa.kind = OLD.kind))
        LOOP
          PERFORM reorder_check(r.id, TG_OP <> 'DELETE');
        END LOOP;
        RETURN NULL;
      END $$;
    CREATE TRIGGER reorder_defaults_watch AFTER INSERT OR UPDATE OR DELETE ON reorder_defaults
      FOR EACH ROW EXECUTE FUNCTION reorder_defaults_watch();
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`
    DROP TRIGGER reorder_defaults_watch ON reorder_defaults;
    DROP FUNCTION reorder_defaults_watch();
    DROP TRIGGER parts_reorder_watch ON parts;
    DROP FUNCTION parts_reorder_watch();
    DROP TRIGGER part_levels_reorder_watch ON part_levels;
    DROP FUNCTION part_levels_reorder_watch();
    DROP FUNCTION reorder_check(uuid, boolean);
    DROP TABLE alert_digest_runs;
    DROP TABLE alerts;
    DROP FUNCTION part_reorder_rule(uuid);
    DROP TABLE reorder_defaults;
  `);
}
