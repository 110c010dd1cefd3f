/** Verification of a fix: the verdict on the window after an adjustment, and the tests behind it. */
export { verifyFix, type VerifyFixInput, type VerificationResult, type Verdict } from "./verify-fix";
export { oneSampleEquivalence, welchEquivalence, twoOneSidedTests, type EquivalenceTest } from "./tost";
export { sliceSubgroups } from "./slice-data";
