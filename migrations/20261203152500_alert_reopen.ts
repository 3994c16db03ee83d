// Stock alerts listed one part twice, a minute apart: a part that fell to its reorder point, came
// back above it (a hold let go, a delivery) and fell again raised a second alert while the first
// still waited unseen. A fall now reopens the part's latest alert that nobody has acknowledged
// yet, so the list keeps one line per part until someone has seen it, and buyers are not mailed
// again for what their first mail already said. Once an alert has been acknowledged, the next fall
// is a new alert, as before.
import type { Knex } from 'knex';

const CHECK_HEAD = `
    CREATE OR REPLACE FUNCTION reorder_check(p_part uuid, p_fell boolean) RETURNS uuid
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
        IF NOT p_fell THEN RETURN NULL; END IF;`;

const CHECK_TAIL = `
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
      END $$;`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(`${CHECK_HEAD}
        -- Still open: nothing new to say.
        IF EXISTS (SELECT 1 FROM alerts WHERE part_id = p_part AND kind = 'reorder_point'
                    AND recovered_at IS NULL) THEN
          RETURN NULL;
        END IF;
        -- The part's latest alert recovered but nobody has seen it yet: the same alert again.
        UPDATE alerts SET recovered_at = NULL, free_at_raise = LEAST(free_at_raise, v_free),
                          reorder_point = v_point
         WHERE acknowledged_at IS NULL
           AND id = (SELECT a.id FROM alerts a
                      WHERE a.part_id = p_part AND a.kind = 'reorder_point'
                      ORDER BY a.raised_at DESC LIMIT 1)
        RETURNING id INTO v_alert;
        IF v_alert IS NOT NULL THEN RETURN NULL; END IF;${CHECK_TAIL}`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(`${CHECK_HEAD}${CHECK_TAIL}`);
}
