-- Initial Holdline schema. Written by hand to match prisma/schema.prisma
-- (Prisma's SQLite conventions: Float -> REAL, Boolean -> BOOLEAN, DateTime -> DATETIME).

CREATE TABLE "Material" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "category" TEXT NOT NULL,
    "conductivity_W_mK" REAL NOT NULL,
    "conductivitySource" TEXT NOT NULL,
    "density_kg_m3" REAL NOT NULL,
    "densitySource" TEXT NOT NULL,
    "specificHeat_J_kgK" REAL NOT NULL,
    "specificHeatSource" TEXT NOT NULL,
    "emissivity" REAL NOT NULL,
    "emissivitySource" TEXT NOT NULL,
    "solarAbsorptivity" REAL NOT NULL,
    "solarAbsorptivitySource" TEXT NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "Material_name_key" ON "Material"("name");

CREATE TABLE "Product" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "category" TEXT NOT NULL,
    "shape" TEXT NOT NULL,
    "dimA_m" REAL NOT NULL,
    "dimB_m" REAL,
    "dimC_m" REAL,
    "mass_kg" REAL NOT NULL,
    "waterFraction" REAL NOT NULL,
    "proteinFraction" REAL NOT NULL,
    "fatFraction" REAL NOT NULL,
    "carbohydrateFraction" REAL NOT NULL,
    "fibreFraction" REAL NOT NULL,
    "ashFraction" REAL NOT NULL,
    "compositionSource" TEXT NOT NULL DEFAULT '',
    "initialFreezing_C" REAL,
    "density_kg_m3" REAL,
    "cpUnfrozen_J_kgK" REAL,
    "cpFrozen_J_kgK" REAL,
    "kUnfrozen_W_mK" REAL,
    "kFrozen_W_mK" REAL,
    "latentHeat_J_kg" REAL,
    "freezeSensitive" BOOLEAN NOT NULL DEFAULT false,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "Product_name_key" ON "Product"("name");

CREATE TABLE "Shipper" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "innerLength_m" REAL NOT NULL,
    "innerWidth_m" REAL NOT NULL,
    "innerHeight_m" REAL NOT NULL,
    "wallLayers" TEXT NOT NULL,
    "lidLayers" TEXT,
    "finishMaterial" TEXT NOT NULL,
    "emptyMass_kg" REAL NOT NULL,
    "cost" REAL NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "Shipper_name_key" ON "Shipper"("name");

CREATE TABLE "CoolantPack" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    "mass_kg" REAL NOT NULL,
    "length_m" REAL NOT NULL,
    "width_m" REAL NOT NULL,
    "thickness_m" REAL NOT NULL,
    "phaseChange_C" REAL NOT NULL,
    "latentHeat_J_kg" REAL NOT NULL,
    "cpSolid_J_kgK" REAL NOT NULL,
    "cpLiquid_J_kgK" REAL NOT NULL,
    "conditioning_C" REAL NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "CoolantPack_name_key" ON "CoolantPack"("name");

CREATE TABLE "Route" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "segments" TEXT NOT NULL,
    "notes" TEXT NOT NULL DEFAULT '',
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "Route_name_key" ON "Route"("name");

CREATE TABLE "RuleSet" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "jurisdiction" TEXT NOT NULL,
    "chilledMax_C" REAL NOT NULL,
    "frozenMax_C" REAL NOT NULL,
    "hotHoldMin_C" REAL NOT NULL,
    "thawWaterMax_C" REAL,
    "outsideControlMax_s" REAL,
    "chillExcursionMax_s" REAL,
    "hotExcursionMax_s" REAL,
    "thawSurfaceAboveMax_s" REAL,
    "source" TEXT NOT NULL,
    "reminder" TEXT NOT NULL,
    "isDefault" BOOLEAN NOT NULL DEFAULT false,
    "version" INTEGER NOT NULL DEFAULT 1,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "RuleSet_name_key" ON "RuleSet"("name");

CREATE TABLE "Plan" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "kind" TEXT NOT NULL,
    "name" TEXT NOT NULL,
    "input" TEXT NOT NULL,
    "result" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP
);

CREATE TABLE "Setting" (
    "id" INTEGER NOT NULL PRIMARY KEY DEFAULT 1,
    "temperatureUnit" TEXT NOT NULL DEFAULT 'C',
    "massUnit" TEXT NOT NULL DEFAULT 'kg',
    "lengthUnit" TEXT NOT NULL DEFAULT 'mm',
    "seededAt" DATETIME,
    "version" INTEGER NOT NULL DEFAULT 1,
    "updatedAt" DATETIME NOT NULL
);
