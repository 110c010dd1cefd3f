-- CreateTable
CREATE TABLE "Site" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "name" TEXT NOT NULL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP
);

-- CreateTable
CREATE TABLE "Area" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "siteId" INTEGER NOT NULL,
    "name" TEXT NOT NULL,
    CONSTRAINT "Area_siteId_fkey" FOREIGN KEY ("siteId") REFERENCES "Site" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Process" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "areaId" INTEGER NOT NULL,
    "name" TEXT NOT NULL,
    "kind" TEXT NOT NULL,
    CONSTRAINT "Process_areaId_fkey" FOREIGN KEY ("areaId") REFERENCES "Area" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Characteristic" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "processId" INTEGER NOT NULL,
    "name" TEXT NOT NULL,
    "unit" TEXT NOT NULL,
    "chartType" TEXT NOT NULL,
    "subgroupSize" INTEGER NOT NULL,
    "target" REAL,
    "lowerSpecLimit" REAL,
    "upperSpecLimit" REAL,
    "ruleSet" TEXT NOT NULL,
    "safetyRelated" BOOLEAN NOT NULL DEFAULT false,
    "description" TEXT,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Characteristic_processId_fkey" FOREIGN KEY ("processId") REFERENCES "Process" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Subgroup" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "characteristicId" INTEGER NOT NULL,
    "sequence" INTEGER NOT NULL,
    "timestamp" DATETIME NOT NULL,
    "count" REAL,
    "size" REAL,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "Subgroup_characteristicId_fkey" FOREIGN KEY ("characteristicId") REFERENCES "Characteristic" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "Measurement" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "subgroupId" INTEGER NOT NULL,
    "position" INTEGER NOT NULL,
    "value" REAL NOT NULL,
    CONSTRAINT "Measurement_subgroupId_fkey" FOREIGN KEY ("subgroupId") REFERENCES "Subgroup" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "SubgroupTag" (
    "subgroupId" INTEGER NOT NULL,
    "key" TEXT NOT NULL,
    "value" TEXT NOT NULL,

    PRIMARY KEY ("subgroupId", "key"),
    CONSTRAINT "SubgroupTag_subgroupId_fkey" FOREIGN KEY ("subgroupId") REFERENCES "Subgroup" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateTable
CREATE TABLE "ProcessEvent" (
    "id" INTEGER NOT NULL PRIMARY KEY AUTOINCREMENT,
    "processId" INTEGER NOT NULL,
    "occurredAt" DATETIME NOT NULL,
    "kind" TEXT NOT NULL,
    "causeCategory" TEXT,
    "description" TEXT NOT NULL,
    "value" REAL,
    "unit" TEXT,
    "createdAt" DATETIME NOT NULL DEFAULT CURRENT_TIMESTAMP,
    CONSTRAINT "ProcessEvent_processId_fkey" FOREIGN KEY ("processId") REFERENCES "Process" ("id") ON DELETE CASCADE ON UPDATE CASCADE
);

-- CreateIndex
CREATE UNIQUE INDEX "Site_name_key" ON "Site"("name");

-- CreateIndex
CREATE UNIQUE INDEX "Area_siteId_name_key" ON "Area"("siteId", "name");

-- CreateIndex
CREATE UNIQUE INDEX "Process_areaId_name_key" ON "Process"("areaId", "name");

-- CreateIndex
CREATE UNIQUE INDEX "Characteristic_processId_name_key" ON "Characteristic"("processId", "name");

-- CreateIndex
CREATE INDEX "Subgroup_characteristicId_timestamp_idx" ON "Subgroup"("characteristicId", "timestamp");

-- CreateIndex
CREATE UNIQUE INDEX "Subgroup_characteristicId_sequence_key" ON "Subgroup"("characteristicId", "sequence");

-- CreateIndex
CREATE UNIQUE INDEX "Measurement_subgroupId_position_key" ON "Measurement"("subgroupId", "position");

-- CreateIndex
CREATE INDEX "SubgroupTag_key_value_idx" ON "SubgroupTag"("key", "value");

-- CreateIndex
CREATE INDEX "ProcessEvent_processId_occurredAt_idx" ON "ProcessEvent"("processId", "occurredAt");
