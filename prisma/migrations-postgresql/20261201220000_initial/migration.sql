-- Initial Holdline schema for PostgreSQL: the same tables as prisma/migrations/20261201220000_initial,
-- in Prisma's PostgreSQL conventions (SERIAL ids, DOUBLE PRECISION, TIMESTAMP(3)). Drafted with
-- scripts/pg-ddl.mjs from prisma/schema.prisma, then committed; never edit it once applied.

CREATE TABLE "Material" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "category" TEXT NOT NULL,
    "conductivity_W_mK" DOUBLE PRECISION NOT NULL,
    "conductivitySource" TEXT NOT NULL,
    "density_kg_m3" DOUBLE PRECISION NOT NULL,
    "densitySource" TEXT NOT NULL,
    "specificHeat_J_kgK" DOUBLE PRECISION NOT NULL,
    "specificHeatSource" TEXT NOT NULL,
    "emissivity" DOUBLE PRECISION NOT NULL,
    "emissivitySource" TEXT NOT NULL,
    "solarAbsorptivity" DOUBLE PRECISION NOT NULL,
    "solarAbsorptivitySource" TEXT NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Material_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "Material_name_key" ON "Material"("name");

CREATE TABLE "Product" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "category" TEXT NOT NULL,
    "shape" TEXT NOT NULL,
    "dimA_m" DOUBLE PRECISION NOT NULL,
    "dimB_m" DOUBLE PRECISION,
    "dimC_m" DOUBLE PRECISION,
    "mass_kg" DOUBLE PRECISION NOT NULL,
    "waterFraction" DOUBLE PRECISION NOT NULL,
    "proteinFraction" DOUBLE PRECISION NOT NULL,
    "fatFraction" DOUBLE PRECISION NOT NULL,
    "carbohydrateFraction" DOUBLE PRECISION NOT NULL,
    "fibreFraction" DOUBLE PRECISION NOT NULL,
    "ashFraction" DOUBLE PRECISION NOT NULL,
    "compositionSource" TEXT NOT NULL DEFAULT '',
    "initialFreezing_C" DOUBLE PRECISION,
    "density_kg_m3" DOUBLE PRECISION,
    "cpUnfrozen_J_kgK" DOUBLE PRECISION,
    "cpFrozen_J_kgK" DOUBLE PRECISION,
    "kUnfrozen_W_mK" DOUBLE PRECISION,
    "kFrozen_W_mK" DOUBLE PRECISION,
    "latentHeat_J_kg" DOUBLE PRECISION,
    "freezeSensitive" BOOLEAN NOT NULL DEFAULT false,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Product_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "Product_name_key" ON "Product"("name");

CREATE TABLE "Shipper" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "innerLength_m" DOUBLE PRECISION NOT NULL,
    "innerWidth_m" DOUBLE PRECISION NOT NULL,
    "innerHeight_m" DOUBLE PRECISION NOT NULL,
    "wallLayers" TEXT NOT NULL,
    "lidLayers" TEXT,
    "finishMaterial" TEXT NOT NULL,
    "emptyMass_kg" DOUBLE PRECISION NOT NULL,
    "cost" DOUBLE PRECISION NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Shipper_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "Shipper_name_key" ON "Shipper"("name");

CREATE TABLE "CoolantPack" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "mass_kg" DOUBLE PRECISION NOT NULL,
    "length_m" DOUBLE PRECISION NOT NULL,
    "width_m" DOUBLE PRECISION NOT NULL,
    "thickness_m" DOUBLE PRECISION NOT NULL,
    "phaseChange_C" DOUBLE PRECISION NOT NULL,
    "latentHeat_J_kg" DOUBLE PRECISION NOT NULL,
    "cpSolid_J_kgK" DOUBLE PRECISION NOT NULL,
    "cpLiquid_J_kgK" DOUBLE PRECISION NOT NULL,
    "conditioning_C" DOUBLE PRECISION NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "CoolantPack_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "CoolantPack_name_key" ON "CoolantPack"("name");

CREATE TABLE "Route" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "segments" TEXT NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Route_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "Route_name_key" ON "Route"("name");

CREATE TABLE "RuleSet" (
    "id" SERIAL NOT NULL,
    "name" TEXT NOT NULL,
    "jurisdiction" TEXT NOT NULL,
    "chilledMax_C" DOUBLE PRECISION NOT NULL,
    "frozenMax_C" DOUBLE PRECISION NOT NULL,
    "hotHoldMin_C" DOUBLE PRECISION NOT NULL,
    "thawWaterMax_C" DOUBLE PRECISION,
    "outsideControlMax_s" DOUBLE PRECISION,
    "chillExcursionMax_s" DOUBLE PRECISION,
    "hotExcursionMax_s" DOUBLE PRECISION,
    "thawSurfaceAboveMax_s" DOUBLE PRECISION,
    "source" TEXT NOT NULL,
    "reminder" TEXT NOT NULL,
    "isDefault" BOOLEAN NOT NULL DEFAULT false,
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "RuleSet_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "RuleSet_name_key" ON "RuleSet"("name");

CREATE TABLE "Plan" (
    "id" SERIAL NOT NULL,
    "kind" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "input" TEXT NOT NULL,
    "result" TEXT NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Plan_pkey" PRIMARY KEY ("id")
);

CREATE TABLE "Setting" (
    "id" INTEGER NOT NULL DEFAULT 1,
    "temperatureUnit" TEXT NOT NULL DEFAULT 'C',
    "massUnit" TEXT NOT NULL DEFAULT 'kg',
    "lengthUnit" TEXT NOT NULL DEFAULT 'mm',
    "seededAt" TIMESTAMP(3),
    "version" INTEGER NOT NULL DEFAULT 1,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Setting_pkey" PRIMARY KEY ("id")
);
