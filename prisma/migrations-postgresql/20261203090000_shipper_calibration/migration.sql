-- PostgreSQL twin of prisma/migrations/20261203090000_shipper_calibration (scripts/pg-ddl.mjs --twin).
-- A box calibrated from a logged trip records where its factors came from (JSON text), null for a box as built.
ALTER TABLE "Shipper" ADD COLUMN "calibration" TEXT;
