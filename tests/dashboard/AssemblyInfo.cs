// Each browser test starts an agent and a Chromium; run them one at a time so a 2-core machine is not swamped.
[assembly: CollectionBehavior(DisableTestParallelization = true)]
