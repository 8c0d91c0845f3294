namespace LoopWatch.Dashboard.Access;

/// <summary>The dashboard's roles and the policies built on them; admin may do everything.</summary>
public static class Roles
{
    public const string Viewer = "viewer";
    public const string Operator = "operator";
    public const string Maintenance = "maintenance";
    public const string Admin = "admin";

    /// <summary>Every role a user may hold.</summary>
    public static IReadOnlyList<string> All { get; } = [Viewer, Operator, Maintenance, Admin];

    /// <summary>Policy: acknowledge, shelve, comment.</summary>
    public const string CanOperate = "can-operate";

    /// <summary>Policy: record a valve service.</summary>
    public const string CanMaintain = "can-maintain";

    /// <summary>Policy: manage users.</summary>
    public const string CanAdminister = "can-administer";

    /// <summary>Policy: see pages (open unless the dashboard requires login).</summary>
    public const string CanView = "can-view";
}
