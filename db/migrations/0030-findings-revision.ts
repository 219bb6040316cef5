import { DataTypes, type QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

// Every write that changes what a trial's findings are computed from bumps the trial's
// findings_revision, in the database itself (triggers), so no code path can forget it: a submitted
// report written, edited or removed, a reading of an "other" alteration, an enrolment's size, the
// measurements copied into an application, the pattern's size chart and fabric needs. The findings
// stored for a trial are fresh while findings_computed_revision equals it, so a read never has to
// load the reports to find out.
const TRIGGERS = `
CREATE FUNCTION basted_bump_trial_findings(trial uuid) RETURNS void LANGUAGE sql AS $$
  UPDATE trials SET findings_revision = findings_revision + 1 WHERE id = trial;
$$;

CREATE FUNCTION basted_findings_on_report() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' THEN
    IF NEW.submitted_at IS NULL AND OLD.submitted_at IS NULL THEN RETURN NULL; END IF;
    IF NEW.content IS NOT DISTINCT FROM OLD.content AND NEW.submitted_at IS NOT DISTINCT FROM OLD.submitted_at THEN RETURN NULL; END IF;
    PERFORM basted_bump_trial_findings((SELECT trial_id FROM enrollments WHERE id = NEW.enrollment_id));
  ELSIF TG_OP = 'INSERT' THEN
    IF NEW.submitted_at IS NOT NULL THEN PERFORM basted_bump_trial_findings((SELECT trial_id FROM enrollments WHERE id = NEW.enrollment_id)); END IF;
  ELSE
    IF OLD.submitted_at IS NOT NULL THEN PERFORM basted_bump_trial_findings((SELECT trial_id FROM enrollments WHERE id = OLD.enrollment_id)); END IF;
  END IF;
  RETURN NULL;
END $$;
CREATE TRIGGER reports_findings_revision AFTER INSERT OR UPDATE OR DELETE ON reports
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_report();

CREATE FUNCTION basted_findings_on_enrollment() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE' THEN
    IF NEW.size_id IS DISTINCT FROM OLD.size_id OR NEW.application_id IS DISTINCT FROM OLD.application_id THEN
      PERFORM basted_bump_trial_findings(NEW.trial_id);
    END IF;
  ELSE
    -- A removed enrolment takes its reports along.
    PERFORM basted_bump_trial_findings(OLD.trial_id);
  END IF;
  RETURN NULL;
END $$;
CREATE TRIGGER enrollments_findings_revision AFTER UPDATE OR DELETE ON enrollments
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_enrollment();

CREATE FUNCTION basted_findings_on_application() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF NEW.profile_snapshot IS DISTINCT FROM OLD.profile_snapshot THEN PERFORM basted_bump_trial_findings(NEW.trial_id); END IF;
  RETURN NULL;
END $$;
CREATE TRIGGER applications_findings_revision AFTER UPDATE ON applications
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_application();

CREATE FUNCTION basted_findings_on_mapping() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM basted_bump_trial_findings(CASE WHEN TG_OP = 'DELETE' THEN OLD.trial_id ELSE NEW.trial_id END);
  IF TG_OP = 'UPDATE' AND NEW.trial_id IS DISTINCT FROM OLD.trial_id THEN PERFORM basted_bump_trial_findings(OLD.trial_id); END IF;
  RETURN NULL;
END $$;
CREATE TRIGGER other_alteration_mappings_findings_revision AFTER INSERT OR UPDATE OR DELETE ON other_alteration_mappings
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_mapping();

-- The size chart and the fabric needs belong to the pattern: every trial of it follows.
CREATE FUNCTION basted_findings_on_pattern_part() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  UPDATE trials SET findings_revision = findings_revision + 1
   WHERE pattern_id = (CASE WHEN TG_OP = 'DELETE' THEN OLD.pattern_id ELSE NEW.pattern_id END);
  RETURN NULL;
END $$;
CREATE TRIGGER pattern_sizes_findings_revision AFTER INSERT OR UPDATE OR DELETE ON pattern_sizes
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_pattern_part();
CREATE TRIGGER fabric_needs_findings_revision AFTER INSERT OR UPDATE OR DELETE ON fabric_needs
  FOR EACH ROW EXECUTE FUNCTION basted_findings_on_pattern_part();
`;

const DROP = `
DROP TRIGGER IF EXISTS fabric_needs_findings_revision ON fabric_needs;
DROP TRIGGER IF EXISTS pattern_sizes_findings_revision ON pattern_sizes;
DROP TRIGGER IF EXISTS other_alteration_mappings_findings_revision ON other_alteration_mappings;
DROP TRIGGER IF EXISTS applications_findings_revision ON applications;
DROP TRIGGER IF EXISTS enrollments_findings_revision ON enrollments;
DROP TRIGGER IF EXISTS reports_findings_revision ON reports;
DROP FUNCTION IF EXISTS basted_findings_on_pattern_part();
DROP FUNCTION IF EXISTS basted_findings_on_mapping();
DROP FUNCTION IF EXISTS basted_findings_on_application();
DROP FUNCTION IF EXISTS basted_findings_on_enrollment();
DROP FUNCTION IF EXISTS basted_findings_on_report();
DROP FUNCTION IF EXISTS basted_bump_trial_findings(uuid);
`;

export const up: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    // Starts at 1 and computed at 0: every trial's stored findings count as stale once.
    await qi.addColumn('trials', 'findings_revision', { type: DataTypes.BIGINT, allowNull: false, defaultValue: 1 }, { transaction });
    await qi.addColumn('trials', 'findings_computed_revision', { type: DataTypes.BIGINT, allowNull: false, defaultValue: 0 }, { transaction });
    // The engine version and thresholds the stored findings were computed with.
    await qi.addColumn('trials', 'findings_config_hash', { type: DataTypes.STRING(64), allowNull: true }, { transaction });
    await qi.addColumn('trials', 'findings_computed_at', { type: DataTypes.DATE, allowNull: true }, { transaction });
    // The change table of every finding of the draft, keyed "kind|direction", so a read picks
    // the rows of the findings the studio will fix without loading the reports.
    await qi.addColumn('finding_snapshots', 'changes', { type: DataTypes.JSONB, allowNull: false, defaultValue: {} }, { transaction });
    // Reports counted over every draft (a tester counts once per draft).
    await qi.addColumn('finding_snapshots', 'reports', { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 }, { transaction });
    await qi.sequelize.query(TRIGGERS, { transaction });
  });
};

export const down: MigrationFn<QueryInterface> = async ({ context: qi }) => {
  await qi.sequelize.transaction(async (transaction) => {
    await qi.sequelize.query(DROP, { transaction });
    await qi.removeColumn('finding_snapshots', 'reports', { transaction });
    await qi.removeColumn('finding_snapshots', 'changes', { transaction });
    await qi.removeColumn('trials', 'findings_computed_at', { transaction });
    await qi.removeColumn('trials', 'findings_config_hash', { transaction });
    await qi.removeColumn('trials', 'findings_computed_revision', { transaction });
    await qi.removeColumn('trials', 'findings_revision', { transaction });
  });
};
