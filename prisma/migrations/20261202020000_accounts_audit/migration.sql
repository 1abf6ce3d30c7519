-- Accounts (used when the database is shared), who saved a plan, and the rule-set history.

ALTER TABLE "Plan" ADD COLUMN "createdById" INTEGER;
ALTER TABLE "Plan" ADD COLUMN "createdByName" TEXT;

CREATE TABLE "Account" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "username" TEXT NOT NULL,
    "displayName" TEXT NOT NULL,
    "passwordHash" TEXT NOT NULL,
    "role" TEXT NOT NULL,
    "disabled" BOOLEAN NOT NULL DEFAULT false,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" DATETIME NOT NULL
);
CREATE UNIQUE INDEX "Account_username_key" ON "Account"("username");

CREATE TABLE "AccountSession" (
    "id" TEXT NOT NULL PRIMARY KEY,
    "accountId" INTEGER NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "expiresAt" DATETIME NOT NULL
);
CREATE INDEX "AccountSession_accountId_idx" ON "AccountSession"("accountId");

CREATE TABLE "RuleSetChange" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "ruleSetId" INTEGER NOT NULL,
    "ruleSetName" TEXT NOT NULL,
    "action" TEXT NOT NULL,
    "version" INTEGER NOT NULL,
    "snapshot" TEXT NOT NULL,
    "byAccountId" INTEGER,
    "byName" TEXT NOT NULL,
    "at" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP
);
CREATE INDEX "RuleSetChange_ruleSetId_at_idx" ON "RuleSetChange"("ruleSetId", "at");
