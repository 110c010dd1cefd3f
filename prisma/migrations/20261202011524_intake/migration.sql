-- CreateTable
CREATE TABLE "LimitSet" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "version" INTEGER NOT NULL,
    "center" REAL NOT NULL,
    "sigma" REAL,
    "subgroupSize" INTEGER NOT NULL,
    "ewmaLambda" REAL,
    "ewmaWidth" REAL,
    "cusumK" REAL,
    "cusumH" REAL,
    "baselineStart" INTEGER NOT NULL,
    "baselineEnd" INTEGER NOT NULL,
    "baselineUsed" INTEGER NOT NULL,
    "appliesFrom" INTEGER NOT NULL,
    "reason" TEXT NOT NULL,
    "approvedBy" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "LimitSet_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "LimitExclusion" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "limitSetId" INTEGER NOT NULL,
    "sequence" INTEGER NOT NULL,
    "reason" TEXT NOT NULL,
    CONSTRAINT "LimitExclusion_limitSetId_fkey" FOREIGN KEY ("limitSetId") REFERENCES "LimitSet" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Signal" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "limitSetId" INTEGER NOT NULL,
    "rule" TEXT NOT NULL,
    "statistic" TEXT NOT NULL,
    "startSequence" INTEGER NOT NULL,
    "endSequence" INTEGER NOT NULL,
    "firing" TEXT NOT NULL,
    "side" TEXT,
    "pattern" TEXT,
    "status" TEXT NOT NULL DEFAULT 'new',
    "detectedAt" DATETIME NOT NULL,
    "updatedAt" DATETIME NOT NULL,
    CONSTRAINT "Signal_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Signal_limitSetId_fkey" FOREIGN KEY ("limitSetId") REFERENCES "LimitSet" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Correction" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "subgroupId" INTEGER NOT NULL,
    "measurementId" INTEGER,
    "field" TEXT NOT NULL,
    "originalValue" REAL NOT NULL,
    "correctedValue" REAL NOT NULL,
    "reason" TEXT NOT NULL,
    "correctedBy" TEXT NOT NULL,
    "correctedAt" DATETIME NOT NULL,
    CONSTRAINT "Correction_subgroupId_fkey" FOREIGN KEY ("subgroupId") REFERENCES "Subgroup" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Correction_measurementId_fkey" FOREIGN KEY ("measurementId") REFERENCES "Measurement" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "SignalEvaluation" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "limitSetId" INTEGER,
    "trigger" TEXT NOT NULL,
    "reason" TEXT NOT NULL,
    "requestedBy" TEXT NOT NULL,
    "at" DATETIME NOT NULL,
    "signalsBefore" INTEGER NOT NULL,
    "signalsAfter" INTEGER NOT NULL,
    CONSTRAINT "SignalEvaluation_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "SignalEvaluation_limitSetId_fkey" FOREIGN KEY ("limitSetId") REFERENCES "LimitSet" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "ImportBatch" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "fileName" TEXT NOT NULL,
    "fileHash" TEXT NOT NULL,
    "rowsRead" INTEGER NOT NULL,
    "subgroupsAdded" INTEGER NOT NULL,
    "subgroupsAlreadyPresent" INTEGER NOT NULL,
    "rowsRejected" INTEGER NOT NULL,
    "mode" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "ImportBatch_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- RedefineTables
PRAGMA defer_foreign_keys=ON;
PRAGMA foreign_keys=OFF;
CREATE TABLE "new_Subgroup" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "sequence" INTEGER NOT NULL,
    "timestamp" DATETIME NOT NULL,
    "count" REAL,
    "size" REAL,
    "sourceKey" TEXT,
    "importBatchId" INTEGER,
    "mean" REAL,
    "spread" REAL,
    "ewma" REAL,
    "cusumUpper" REAL,
    "cusumLower" REAL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Subgroup_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE,
    CONSTRAINT "Subgroup_importBatchId_fkey" FOREIGN KEY ("importBatchId") REFERENCES "ImportBatch" ("id") ON DELETE SET NULL ON UPDATE CASCADE
);
INSERT INTO "new_Subgroup" ("characteristicId", "count", "createdAt", "id", "sequence", "size", "timestamp") SELECT "characteristicId", "count", "createdAt", "id", "sequence", "size", "timestamp" FROM "Subgroup";
DROP TABLE "Subgroup";
ALTER TABLE "new_Subgroup" RENAME TO "Subgroup";
CREATE INDEX "Subgroup_characteristicId_timestamp_idx" ON "Subgroup"("characteristicId", "timestamp");
CREATE INDEX "Subgroup_importBatchId_idx" ON "Subgroup"("importBatchId");
CREATE UNIQUE INDEX "Subgroup_characteristicId_sequence_key" ON "Subgroup"("characteristicId", "sequence");
CREATE UNIQUE INDEX "Subgroup_characteristicId_sourceKey_key" ON "Subgroup"("characteristicId", "sourceKey");
PRAGMA foreign_keys=ON;
PRAGMA defer_foreign_keys=OFF;

-- CreateIndex
CREATE UNIQUE INDEX "LimitSet_characteristicId_version_key" ON "LimitSet"("characteristicId", "version");

-- CreateIndex
CREATE UNIQUE INDEX "LimitExclusion_limitSetId_sequence_key" ON "LimitExclusion"("limitSetId", "sequence");

-- CreateIndex
CREATE INDEX "Signal_characteristicId_endSequence_idx" ON "Signal"("characteristicId", "endSequence");

-- CreateIndex
CREATE INDEX "Signal_characteristicId_startSequence_idx" ON "Signal"("characteristicId", "startSequence");

-- CreateIndex
CREATE INDEX "Signal_limitSetId_idx" ON "Signal"("limitSetId");

-- CreateIndex
CREATE INDEX "Correction_subgroupId_idx" ON "Correction"("subgroupId");

-- CreateIndex
CREATE INDEX "SignalEvaluation_characteristicId_at_idx" ON "SignalEvaluation"("characteristicId", "at");

-- CreateIndex
CREATE INDEX "ImportBatch_characteristicId_createdAt_idx" ON "ImportBatch"("characteristicId", "createdAt");
