## gate lowering, passes, emitters
