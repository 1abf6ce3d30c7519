-- A box calibrated from a logged trip records where its factors came from (JSON text), null for a box as built.
-- Written by hand to match prisma/schema.prisma (String? -> TEXT, nullable).
ALTER TABLE "Shipper" ADD COLUMN "calibration" TEXT;
