namespace LoopWatch.Analytics.Advice;

/// <summary>The caution shown with every piece of advice.</summary>
public static class AdviceCaution
{
    /// <summary>Shown beside every adviser's figures, on pages and in JSON.</summary>
    public const string Text = "Advice only: any change follows the site's procedures and is made by qualified people; " +
        "LoopWatch never writes to the control system.";
}
