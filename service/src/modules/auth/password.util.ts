// The password and secret helpers moved to common/util (the users module needs them too). This re-export keeps
// the old path working until every importer has moved; new code imports '../../common/util/password.util.js'.
export * from '../../common/util/password.util.js';
