-- PostgreSQL twin of prisma/migrations/20261202090000_ruleset_fields (scripts/pg-ddl.mjs --twin).
-- Rule sets: time as a control for cold food, thawing of ready-to-eat food, two-stage cooling.
-- Products: ready to eat or raw. Every new column is nullable or has a default, so
-- ALTER TABLE ... ADD COLUMN keeps existing rows (Prisma's SQLite conventions).
ALTER TABLE "Product" ADD COLUMN "readyToEat" BOOLEAN NOT NULL DEFAULT false;
ALTER TABLE "RuleSet" ADD COLUMN "outsideControlColdMax_s" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "outsideControlColdCeiling_C" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "thawReadyToEatAboveMax_s" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolFrom_C" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage1To_C" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage1Max_s" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2To_C" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2Max_s" DOUBLE PRECISION;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2Counted" TEXT NOT NULL DEFAULT 'in_all';
