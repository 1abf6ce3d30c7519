// The planner page's loading state (see app/_components/PageLoading.tsx for why it is per segment).
export { default } from "../_components/PageLoading";
