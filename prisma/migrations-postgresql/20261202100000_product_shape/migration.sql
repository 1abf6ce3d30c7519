-- PostgreSQL twin of prisma/migrations/20261202100000_product_shape (scripts/pg-ddl.mjs --twin).
-- Hollow products: the wall thickness of a sphere or cylinder around a closed cavity (a whole bird).
-- Null means a solid item. Written by hand to match prisma/schema.prisma (Float? -> REAL, nullable).
ALTER TABLE "Product" ADD COLUMN "wallThickness_m" DOUBLE PRECISION;
