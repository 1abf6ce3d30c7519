-- Accounts (used when the database is shared), who saved a plan, and the rule-set history:
-- the PostgreSQL twin of prisma/migrations/20261202020000_accounts_audit.

ALTER TABLE "Plan" ADD COLUMN "createdById" INTEGER;
ALTER TABLE "Plan" ADD COLUMN "createdByName" TEXT;

CREATE TABLE "Account" (
    "id" SERIAL NOT NULL,
    "username" TEXT NOT NULL,
    "displayName" TEXT NOT NULL,
    "passwordHash" TEXT NOT NULL,
    "role" TEXT NOT NULL,
    "disabled" BOOLEAN NOT NULL DEFAULT false,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "updatedAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "Account_pkey" PRIMARY KEY ("id")
);
CREATE UNIQUE INDEX "Account_username_key" ON "Account"("username");

CREATE TABLE "AccountSession" (
    "id" TEXT NOT NULL,
    "accountId" INTEGER NOT NULL,
    "createdAt" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    "expiresAt" TIMESTAMP(3) NOT NULL,
    CONSTRAINT "AccountSession_pkey" PRIMARY KEY ("id")
);
CREATE INDEX "AccountSession_accountId_idx" ON "AccountSession"("accountId");

CREATE TABLE "RuleSetChange" (
    "id" SERIAL NOT NULL,
    "ruleSetId" INTEGER NOT NULL,
    "ruleSetName" TEXT NOT NULL,
    "action" TEXT NOT NULL,
    "version" INTEGER NOT NULL,
    "snapshot" TEXT NOT NULL,
    "byAccountId" INTEGER,
    "byName" TEXT NOT NULL,
    "at" TIMESTAMP(3) NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "RuleSetChange_pkey" PRIMARY KEY ("id")
);
CREATE INDEX "RuleSetChange_ruleSetId_at_idx" ON "RuleSetChange"("ruleSetId", "at");
