export async function runScaleBench(_dir: string): Promise<void> {}
