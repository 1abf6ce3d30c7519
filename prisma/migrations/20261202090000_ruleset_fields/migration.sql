-- Rule sets: time as a control for cold food, thawing of ready-to-eat food, two-stage cooling.
-- Products: ready to eat or raw. Every new column is nullable or has a default, so
-- ALTER TABLE ... ADD COLUMN keeps existing rows (Prisma's SQLite conventions).

ALTER TABLE "Product" ADD COLUMN "readyToEat" BOOLEAN NOT NULL DEFAULT false;

ALTER TABLE "RuleSet" ADD COLUMN "outsideControlColdMax_s" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "outsideControlColdCeiling_C" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "thawReadyToEatAboveMax_s" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolFrom_C" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage1To_C" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage1Max_s" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2To_C" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2Max_s" REAL;
ALTER TABLE "RuleSet" ADD COLUMN "coolStage2Counted" TEXT NOT NULL DEFAULT 'in_all';
